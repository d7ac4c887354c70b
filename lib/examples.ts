import { readdir, readFile } from "node:fs/promises";
import path from "node:path";

/** An example netlist from `solver/examples/*.pwn`, as the editor's picker shows it. */
export interface NetlistExample {
  name: string;
  title: string;
  text: string;
}

const EXAMPLES_DIR = path.join(process.cwd(), "solver", "examples");

/** The bundled example netlists, sorted by title; [] when the folder is missing. Server only. */
export async function listExamples(): Promise<NetlistExample[]> {
  const files = await readdir(EXAMPLES_DIR).catch(() => [] as string[]);
  const examples = await Promise.all(
    files
      .filter((f) => f.endsWith(".pwn"))
      .map(async (file) => {
        const text = await readFile(path.join(EXAMPLES_DIR, file), "utf8");
        const name = file.replace(/\.pwn$/, "");
        const title = /^\s*title\s+(.+?)\s*$/m.exec(text)?.[1] ?? name;
        return { name, title, text };
      }),
  );
  return examples.sort((a, b) => a.title.localeCompare(b.title));
}
