/**
 * The charting library renders trace names, hover text and annotations as a small HTML subset (`<a>`,
 * `<b>`, `<br>` …), so a bench measurement named `<a href=…>bench</a>` became a link on every run page
 * (issue 13). Every piece of user text put on a plot goes through here: `&`, `<` and `>` become
 * entities, which the library shows as the characters themselves. Our own markup (`<br>`, `<b>`)
 * is added around the escaped text.
 */
export function plotText(text: string): string {
  return text.replaceAll("&", "&amp;").replaceAll("<", "&lt;").replaceAll(">", "&gt;");
}
