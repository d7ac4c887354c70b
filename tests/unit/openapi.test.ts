import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { openApiDocument } from "@/lib/openapi/document";

const ROOT = path.resolve(__dirname, "../..");

/** Every app/api/**\/route.ts as OpenAPI path + the HTTP methods it exports. */
function routesOnDisk(): Map<string, Set<string>> {
  const out = new Map<string, Set<string>>();
  const walk = (dir: string) => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      const p = path.join(dir, e.name);
      if (e.isDirectory()) walk(p);
      else if (e.name === "route.ts") {
        const rel = path.relative(path.join(ROOT, "app"), path.dirname(p)).split(path.sep).join("/");
        const apiPath = `/${rel}`.replace(/\[\.\.\.(\w+)\]/g, "{$1}").replace(/\[(\w+)\]/g, "{$1}");
        const text = readFileSync(p, "utf8");
        const methods = [
          ...text.matchAll(/export (?:const|async function|function) (GET|POST|PUT|PATCH|DELETE)\b/g),
        ];
        out.set(apiPath, new Set(methods.map((m) => m[1]!.toLowerCase())));
      }
    }
  };
  walk(path.join(ROOT, "app/api"));
  return out;
}

// biome-ignore lint/suspicious/noExplicitAny: the document is plain JSON, read field by field
const doc = openApiDocument("https://pw.example") as any;

describe("OpenAPI document", () => {
  it("lists every route under app/api with exactly the methods its route.ts exports", () => {
    const disk = routesOnDisk();
    expect(disk.size).toBeGreaterThanOrEqual(18);
    const documented = new Map(
      Object.entries(doc.paths as Record<string, object>).map(([p, ops]) => [p, new Set(Object.keys(ops))]),
    );
    for (const [p, methods] of disk)
      expect({ path: p, methods: [...(documented.get(p) ?? [])].sort() }).toEqual({
        path: p,
        methods: [...methods].sort(),
      });
    expect([...documented.keys()].sort()).toEqual([...disk.keys()].sort());
  });

  it("is OpenAPI 3.1 with bearer tokens, and every $ref resolves", () => {
    expect(doc.openapi).toBe("3.1.0");
    expect(doc.servers).toEqual([{ url: "https://pw.example" }]);
    expect(doc.components.securitySchemes.apiToken).toMatchObject({ type: "http", scheme: "bearer" });
    const refs = [...JSON.stringify(doc).matchAll(/"\$ref":"#\/components\/schemas\/(\w+)"/g)].map(
      (m) => m[1],
    );
    expect(refs.length).toBeGreaterThan(20);
    for (const r of refs) expect(doc.components.schemas[r!]).toBeDefined();
    expect(doc.components.schemas.Error.required).toEqual(["error"]);
  });

  it("request shapes come from the routes' zod schemas (lib/validations)", () => {
    const save = doc.paths["/api/projects/{id}/runs"].post;
    const body = save.requestBody.content["application/json"].schema;
    expect(body.required).toEqual(["title", "netlist"]);
    expect(body.properties.title).toMatchObject({ type: "string", minLength: 1, maxLength: 200 });
    expect(body.properties.supersedesId).toMatchObject({ type: "string", format: "uuid" });
    expect(save.parameters).toEqual([expect.objectContaining({ name: "id", in: "path", required: true })]);
    const list = doc.paths["/api/projects/{id}/runs"].get.parameters;
    const pageSize = list.find((p: { name: string }) => p.name === "pageSize");
    expect(pageSize).toMatchObject({ in: "query", required: false });
    expect(pageSize.schema).toMatchObject({ maximum: 100, default: 20 });
    const compare = doc.paths["/api/compare"].get.parameters.map((p: { name: string; required: boolean }) => [
      p.name,
      p.required,
    ]);
    expect(compare).toEqual([
      ["a", true],
      ["b", true],
    ]);
    const review = doc.paths["/api/runs/{id}/review"].post.requestBody.content["application/json"].schema;
    expect(review.properties.action.enum).toEqual(["submit", "sign_off", "send_back", "supersede"]);
    expect(doc.paths["/api/health"].get.security).toEqual([]);
    expect(doc.paths["/api/runs/{id}"].get.responses["404"].content["application/json"].schema).toEqual({
      $ref: "#/components/schemas/Error",
    });
  });
});
