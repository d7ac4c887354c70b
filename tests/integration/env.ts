// vitest setupFiles for the integration project: runs before each test file imports lib/env,
// so lib/db connects to the test database.
import { testDatabaseUrl } from "./test-db-url";

process.env.DATABASE_URL = testDatabaseUrl();
process.env.APP_ENV = "test";
// The object store fake of the test run (scripts/test.sh starts it on E2E_S3_PORT; global-setup.ts
// starts one itself when nothing answers there), never the development one on S3_PORT.
if (!process.env.S3_ENDPOINT) process.env.S3_PORT = process.env.E2E_S3_PORT || "4527";
process.env.S3_BUCKET ||= "phasewright-test";
