import { readdirSync, statSync } from "node:fs";
import path from "node:path";
import { NextRequest } from "next/server";
import { describe, expect, it } from "vitest";
import { pathDecodes, proxy } from "@/proxy";

/** Every route and page folder with a dynamic segment, as a URL path with each `[x]` replaced by `value`. */
function dynamicPaths(value: string): string[] {
  const out: string[] = [];
  const walk = (dir: string, url: string) => {
    for (const name of readdirSync(dir)) {
      const full = path.join(dir, name);
      if (!statSync(full).isDirectory()) {
        if ((name === "route.ts" || name === "page.tsx") && url.includes(value)) out.push(url);
        continue;
      }
      if (name.startsWith("(")) walk(full, url);
      else if (/^\[\.\.\./.test(name)) continue;
      else walk(full, `${url}/${name.startsWith("[") ? value : name}`);
    }
  };
  walk(path.resolve("app"), "");
  return out;
}

describe("malformed percent-encoding in ids (issue 13: 500 on every [id] route)", () => {
  const BAD = ["%E0%A4%A", "%", "%zz", "abc%C0"];

  it("every [id] API route and page answers 404 through the one guard in proxy.ts", async () => {
    const paths = dynamicPaths("__ID__");
    expect(paths.filter((p) => p.startsWith("/api/")).length).toBeGreaterThanOrEqual(10);
    expect(paths.filter((p) => !p.startsWith("/api/")).length).toBeGreaterThanOrEqual(5);
    for (const bad of BAD) {
      for (const p of paths) {
        const res = proxy(new NextRequest(`http://localhost${p.replaceAll("__ID__", bad)}`));
        expect(res.status, p).toBe(404);
        if (p.startsWith("/api/"))
          expect(((await res.json()) as { error: { code: string } }).error.code).toBe("not_found");
      }
    }
  });

  it("well-formed paths pass, encoded or not", () => {
    expect(pathDecodes("/runs/9f1c0000-0000-4000-8000-000000000000")).toBe(true);
    expect(pathDecodes("/invite/a%20b")).toBe(true);
    expect(proxy(new NextRequest("http://localhost/api/runs/abc")).status).toBe(200);
    expect(proxy(new NextRequest("http://localhost/projects/%C3%A9")).status).toBe(200);
  });
});

describe("security headers (issue 13: no CSP, framing allowed)", () => {
  it("pages: a nonce CSP without unsafe-eval, no framing, nosniff, referrer policy; a fresh nonce each time", () => {
    const a = proxy(new NextRequest("http://localhost/projects"));
    const b = proxy(new NextRequest("http://localhost/projects"));
    const csp = a.headers.get("content-security-policy") ?? "";
    const nonce = /'nonce-([A-Za-z0-9+/=]+)'/.exec(csp)?.[1];
    expect(nonce).toBeTruthy();
    expect(b.headers.get("content-security-policy")).not.toContain(`'nonce-${nonce}'`);
    expect(csp).toContain("'strict-dynamic'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain("worker-src 'self' blob:");
    expect(csp).not.toContain("unsafe-eval");
    expect(a.headers.get("x-frame-options")).toBe("DENY");
    expect(a.headers.get("x-content-type-options")).toBe("nosniff");
    expect(a.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
    // HSTS only over https.
    expect(a.headers.get("strict-transport-security")).toBeNull();
    const secure = proxy(new NextRequest("https://phasewright.example/projects"));
    expect(secure.headers.get("strict-transport-security")).toMatch(/^max-age=\d+/);
  });

  it("API answers: nothing may load or frame them", () => {
    const res = proxy(new NextRequest("http://localhost/api/runs/abc"));
    expect(res.headers.get("content-security-policy")).toBe("default-src 'none'; frame-ancestors 'none'");
    expect(res.headers.get("x-frame-options")).toBe("DENY");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
  });
});
