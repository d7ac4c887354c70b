#!/usr/bin/env node
/**
 * Builds the `phasewright` command (bin/phasewright.mjs runs it): cli/main.ts and everything it
 * imports bundled by esbuild into one plain-JavaScript file, dist-cli/phasewright.mjs, so the command
 * starts without compiling TypeScript. dist-cli/meta.json lists the bundled inputs.
 *
 * Runs in `npm ci` / `npm install` (the package's `prepare` script), before `npm run solve`
 * (`presolve`), and in scripts/test.sh, start.sh and bench.sh. No network: esbuild ships its binary
 * in its npm package.
 *
 *   node scripts/build-cli.mjs             build
 *   node scripts/build-cli.mjs --if-stale  build only when a bundled source is newer than the bundle
 */
import { existsSync, mkdirSync, readFileSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const OUT_DIR = path.join(ROOT, "dist-cli");
const OUT = path.join(OUT_DIR, "phasewright.mjs");
const META = path.join(OUT_DIR, "meta.json");

/** True when the bundle is missing or any file it was built from changed since. */
function stale() {
  if (!existsSync(OUT) || !existsSync(META)) return true;
  const built = statSync(OUT).mtimeMs;
  let inputs;
  try {
    inputs = Object.keys(JSON.parse(readFileSync(META, "utf8")).inputs ?? {});
  } catch {
    return true;
  }
  if (inputs.length === 0) return true;
  for (const file of [...inputs, "package.json", "scripts/build-cli.mjs"]) {
    const p = path.join(ROOT, file);
    if (!existsSync(p) || statSync(p).mtimeMs > built) return true;
  }
  return false;
}

async function build() {
  const { build: esbuild } = await import("esbuild");
  const { version } = JSON.parse(readFileSync(path.join(ROOT, "package.json"), "utf8"));
  mkdirSync(OUT_DIR, { recursive: true });
  const result = await esbuild({
    absWorkingDir: ROOT,
    entryPoints: ["cli/main.ts"],
    outfile: OUT,
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    // Whitespace and syntax only: smaller to parse, readable names in a stack trace.
    minifyWhitespace: true,
    minifySyntax: true,
    legalComments: "none",
    metafile: true,
    logLevel: "warning",
    define: { "process.env.PHASEWRIGHT_CLI_VERSION": JSON.stringify(version) },
    // Some dependencies call require() for node built-ins; give the ES module one.
    banner: {
      js: "import { createRequire as __pwRequire } from 'node:module'; const require = __pwRequire(import.meta.url);",
    },
  });
  writeFileSync(META, JSON.stringify(result.metafile, null, 1));
  const kb = (statSync(OUT).size / 1024).toFixed(0);
  if (!process.argv.includes("--quiet")) console.error(`[build-cli] dist-cli/phasewright.mjs (${kb} kB)`);
}

if (!process.argv.includes("--if-stale") || stale()) {
  build().catch((error) => {
    console.error(`[build-cli] ${error instanceof Error ? error.message : String(error)}`);
    process.exit(1);
  });
}
