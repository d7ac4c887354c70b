// Copies the editor's browser build into public/monaco/vs so the app serves it itself (no CDN).
// Runs before `next dev` and `next build`; skips the copy when the same version is already there.
import { cp, mkdir, readFile, rm, writeFile } from "node:fs/promises";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const pkg = JSON.parse(await readFile(join(root, "node_modules/monaco-editor/package.json"), "utf8"));
const source = join(root, "node_modules/monaco-editor/min/vs");
const target = join(root, "public/monaco/vs");
const stamp = join(root, "public/monaco/.version");

const current = await readFile(stamp, "utf8").catch(() => "");
if (current.trim() === pkg.version) {
  console.log(`[copy-monaco] public/monaco/vs is monaco-editor ${pkg.version}; nothing to do`);
} else {
  await rm(target, { recursive: true, force: true });
  await mkdir(dirname(target), { recursive: true });
  await cp(source, target, { recursive: true });
  await writeFile(stamp, `${pkg.version}\n`);
  console.log(`[copy-monaco] copied monaco-editor ${pkg.version} to public/monaco/vs`);
}
