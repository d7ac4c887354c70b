// The hydration rule (DEVELOPERS.md): a control that acts only through a client handler takes no click
// before hydration. Button and PlainButton (components/ui/button.tsx) enforce it, so every other file
// uses them instead of a raw <button>; this scan is the one place that notices a new raw one.
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { Button, PlainButton } from "@/components/ui/button";

const root = path.resolve(import.meta.dirname, "../..");

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    return statSync(p).isDirectory() ? sources(p) : /\.tsx$/.test(name) ? [p] : [];
  });
}

describe("hydration rule", () => {
  it("no raw <button> outside components/ui", () => {
    const files = [...sources(path.join(root, "app")), ...sources(path.join(root, "components"))].filter(
      (f) => !f.includes(`${path.sep}components${path.sep}ui${path.sep}`),
    );
    expect(files.length).toBeGreaterThan(50);
    const raw = files.filter((f) => /<button[\s>]/.test(readFileSync(f, "utf8")));
    expect(raw.map((f) => path.relative(root, f))).toEqual([]);
  });

  it("server-rendered, an onClick button is disabled and a submit button is not", () => {
    const click = () => undefined;
    const plain = renderToStaticMarkup(createElement(PlainButton, { onClick: click }, "Reset view"));
    const styled = renderToStaticMarkup(createElement(Button, { onClick: click }, "Save"));
    const submit = renderToStaticMarkup(createElement(PlainButton, { type: "submit" }, "Send"));
    expect(plain).toMatch(/<button type="button" disabled="">Reset view<\/button>/);
    expect(styled).toContain('disabled=""');
    expect(submit).not.toContain("disabled");
  });
});
