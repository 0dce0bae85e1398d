/** The known name a mistyped one most likely meant, for "did you mean" hints. */

/** Levenshtein distance (insertions, deletions, substitutions), case-insensitive. */
export function editDistance(a: string, b: string): number {
  const x = a.toLowerCase();
  const y = b.toLowerCase();
  let previous = Array.from({ length: y.length + 1 }, (_, j) => j);
  for (let i = 1; i <= x.length; i++) {
    const row = [i];
    for (let j = 1; j <= y.length; j++) {
      row.push(Math.min(previous[j]! + 1, row[j - 1]! + 1, previous[j - 1]! + (x[i - 1] === y[j - 1] ? 0 : 1)));
    }
    previous = row;
  }
  return previous[y.length]!;
}

/**
 * The candidate nearest to `word`, when it is near enough to be a typo: at most a third of the
 * word's length in edits (so a word under 3 characters gets none: every short key is near every
 * other), and never the word itself. Ties go to the earlier candidate.
 */
export function closestName(word: string, candidates: readonly string[]): string | undefined {
  if (word.length > 64) return undefined;
  const limit = Math.floor(word.length / 3);
  if (limit === 0) return undefined;
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    if (candidate === word) continue;
    const d = editDistance(word, candidate);
    if (d <= limit && d < bestDistance) {
      best = candidate;
      bestDistance = d;
    }
  }
  return best;
}
