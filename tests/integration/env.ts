// vitest setupFiles for the integration project: runs before each test file imports lib/env,
// so lib/db connects to the test database.
import { testDatabaseUrl } from "./test-db-url";

process.env.DATABASE_URL = testDatabaseUrl();
process.env.APP_ENV = "test";
