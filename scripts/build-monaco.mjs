// Builds the editor the app serves itself (no CDN) into public/monaco/: the editor core with its
// contributions (find, hover, code actions, suggestions, …) but none of the bundled languages and
// none of their language-service workers (CSS, JSON, HTML, TypeScript) — the netlist editor only needs
// the editor's own worker. Runs before `next dev` and `next build`; skips the work when public/monaco
// already holds this version of monaco-editor built by this script.
import { readFile, rm, writeFile } from "node:fs/promises";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { build } from "esbuild";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const pkg = JSON.parse(await readFile(join(root, "node_modules/monaco-editor/package.json"), "utf8"));
const script = await readFile(fileURLToPath(import.meta.url), "utf8");
const out = process.env.MONACO_OUT ?? join(root, "public/monaco");
const stamp = join(out, ".version");
const version = `${pkg.version} ${script.length}`;

if ((await readFile(stamp, "utf8").catch(() => "")).trim() === version) {
  console.log(`[build-monaco] public/monaco holds monaco-editor ${pkg.version}; nothing to do`);
  process.exit(0);
}

const editorDir = join(root, "node_modules/monaco-editor/esm/vs/editor");
const main = await readFile(join(editorDir, "editor.main.js"), "utf8");
// The entry: editor.main.js without the language definitions, the language services and the LSP client.
const entry = main
  .split("\n")
  .filter(
    (line) =>
      !/languages\/(definitions|features)|monaco-lsp-client|\bas (css|html|json|typescript|lsp) \}/.test(
        line,
      ),
  )
  .join("\n");
if (!entry.includes("editor.api.js")) throw new Error("[build-monaco] unexpected editor.main.js layout");

await rm(out, { recursive: true, force: true });
const common = { bundle: true, minify: true, legalComments: "none", logLevel: "warning", target: "es2022" };
await build({
  ...common,
  stdin: { contents: entry, resolveDir: editorDir, sourcefile: "pw-editor-entry.js" },
  format: "iife",
  globalName: "pwMonaco",
  outfile: join(out, "pw-editor.js"),
  loader: { ".ttf": "file" },
  assetNames: "[name]-[hash]",
});
await build({
  ...common,
  entryPoints: [join(editorDir, "editor.worker.js")],
  format: "iife",
  outfile: join(out, "editor.worker.js"),
});
await writeFile(stamp, `${version}\n`);
console.log(`[build-monaco] built monaco-editor ${pkg.version} (editor only) into public/monaco`);
