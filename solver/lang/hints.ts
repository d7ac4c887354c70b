/** Did-you-mean hints: the nearest candidate by edit distance. */

/**
 * Edit distance counting insertions, deletions, substitutions and swaps of two neighbouring letters
 * (optimal string alignment: Damerau's extension of Levenshtein's distance), cost 1 each.
 * O(a·b) time and memory.
 */
export function editDistance(a: string, b: string): number {
  const d: number[][] = Array.from({ length: a.length + 1 }, (_, i) =>
    Array.from({ length: b.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)),
  );
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let best = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1])
        best = Math.min(best, d[i - 2]![j - 2]! + 1);
      d[i]![j] = best;
    }
  }
  return d[a.length]![b.length]!;
}

/** Words longer than this get no edit-distance hint (only a case-only match). */
export const MAX_HINT_WORD = 32;

/**
 * The candidate closest to `word`, or null when none is close enough: a case-only difference always
 * qualifies; otherwise at most 1 edit for words up to 4 letters, 2 up to 8, 3 beyond.
 */
export function nearest(word: string, candidates: Iterable<string>): string | null {
  const lower = word.toLowerCase();
  const limit = word.length <= 4 ? 1 : word.length <= 8 ? 2 : 3;
  // Edit distance is O(a·b): only short words are compared (a 100 kB word took 10 s); a longer one
  // may still match a candidate by case alone. Lengths further apart than the limit can't match.
  const short = word.length <= MAX_HINT_WORD;
  let best: string | null = null;
  let bestDistance = Number.POSITIVE_INFINITY;
  for (const candidate of candidates) {
    if (candidate === word) continue;
    if (candidate.length === word.length && candidate.toLowerCase() === lower) {
      if (0.5 < bestDistance) {
        best = candidate;
        bestDistance = 0.5;
      }
      continue;
    }
    if (!short || Math.abs(candidate.length - word.length) > limit || candidate.length > MAX_HINT_WORD)
      continue;
    const distance = editDistance(word, candidate);
    if (distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return best !== null && bestDistance <= limit ? best : null;
}

/** "did you mean `x`?" or undefined. */
export function didYouMean(word: string, candidates: Iterable<string>): string | undefined {
  const match = nearest(word, candidates);
  return match === null ? undefined : `did you mean \`${match}\`?`;
}
