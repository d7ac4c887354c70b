/**
 * Netlist file patterns for `phasewright check`: `*` and `?` within one path segment, `**` across
 * segments, `{a,b}` alternatives. A pattern without those characters names one file. (Node 20 has
 * no fs.glob; a shell may already have expanded the pattern, which comes to the same.)
 */
import { readdirSync, statSync } from "node:fs";
import path from "node:path";

const MAGIC = /[*?{[]/;

/** A pattern segment as a regular expression (`**` is handled by the walker). */
function segmentRegex(seg: string): RegExp {
  let out = "";
  for (let i = 0; i < seg.length; i++) {
    const ch = seg[i]!;
    if (ch === "*") out += "[^/]*";
    else if (ch === "?") out += "[^/]";
    else if (ch === "{") {
      const end = seg.indexOf("}", i);
      if (end < 0) {
        out += "\\{";
        continue;
      }
      const alts = seg.slice(i + 1, end).split(",");
      out += `(?:${alts.map((a) => a.replace(/[.+^$()|[\]\\]/g, "\\$&").replace(/\*/g, "[^/]*")).join("|")})`;
      i = end;
    } else out += ch.replace(/[.+^$()|[\]\\{}]/g, "\\$&");
  }
  return new RegExp(`^${out}$`);
}

function listDir(dir: string): { name: string; dir: boolean }[] {
  try {
    return readdirSync(dir, { withFileTypes: true })
      .filter((e) => !e.name.startsWith(".") && e.name !== "node_modules")
      .map((e) => ({ name: e.name, dir: e.isDirectory() }));
  } catch {
    return [];
  }
}

function walk(dir: string, rel: string, segs: string[], out: Set<string>): void {
  if (segs.length === 0) return;
  const [seg, ...rest] = segs as [string, ...string[]];
  if (seg === "**") {
    walk(dir, rel, rest, out); // zero segments
    for (const e of listDir(dir)) if (e.dir) walk(path.join(dir, e.name), join(rel, e.name), segs, out);
    return;
  }
  if (!MAGIC.test(seg)) {
    const p = path.join(dir, seg);
    if (rest.length === 0) {
      if (isFile(p)) out.add(join(rel, seg));
    } else walk(p, join(rel, seg), rest, out);
    return;
  }
  const re = segmentRegex(seg);
  for (const e of listDir(dir)) {
    if (!re.test(e.name)) continue;
    if (rest.length === 0) {
      if (!e.dir) out.add(join(rel, e.name));
    } else if (e.dir) walk(path.join(dir, e.name), join(rel, e.name), rest, out);
  }
}

const join = (rel: string, name: string) => (rel === "" ? name : `${rel}/${name}`);

function isFile(p: string): boolean {
  try {
    return statSync(p).isFile();
  } catch {
    return false;
  }
}

/**
 * The files a pattern names, sorted, as paths relative to `cwd` (or absolute when the pattern is).
 * A plain path is returned as given, even when missing (reading it reports the problem).
 */
export function expandPattern(pattern: string, cwd: string): string[] {
  if (!MAGIC.test(pattern)) return [pattern];
  const absolute = path.isAbsolute(pattern);
  const segs = pattern.split(/[\\/]+/).filter((s, i) => s !== "" || i === 0);
  const out = new Set<string>();
  if (absolute) walk(path.parse(pattern).root, "", segs.slice(1), out);
  else walk(cwd, "", segs, out);
  const files = [...out].sort();
  return absolute ? files.map((f) => path.join(path.parse(pattern).root, f)) : files;
}
