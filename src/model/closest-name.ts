/**
 * The known name a mistyped one most likely meant, for "did you mean …?" in error messages: the candidate at the
 * smallest optimal-string-alignment distance (insertions, deletions, substitutions and swaps of neighbours, each 1;
 * common practice), case-insensitive, if that distance is at most 1 for names of up to 4 characters and at most 2
 * for longer ones; undefined when none is that close or two are equally close.
 */
export function closestName(typed: string, candidates: readonly string[]): string | undefined {
  const a = typed.toLowerCase();
  const limit = a.length <= 4 ? 1 : 2;
  let best: string | undefined;
  let bestDistance = limit + 1;
  let tie = false;
  for (const candidate of candidates) {
    const d = alignmentDistance(a, candidate.toLowerCase());
    if (d < bestDistance) [best, bestDistance, tie] = [candidate, d, false];
    else if (d === bestDistance && candidate !== best) tie = true;
  }
  return best !== undefined && !tie ? best : undefined;
}

/** Optimal string alignment distance (restricted Damerau–Levenshtein), by the usual dynamic programme. */
function alignmentDistance(a: string, b: string): number {
  const rows: number[][] = Array.from({ length: a.length + 1 }, (_, i) => [i, ...new Array<number>(b.length).fill(0)]);
  for (let j = 1; j <= b.length; j++) rows[0][j] = j;
  for (let i = 1; i <= a.length; i++)
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min(rows[i - 1][j] + 1, rows[i][j - 1] + 1, rows[i - 1][j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d = Math.min(d, rows[i - 2][j - 2] + 1);
      rows[i][j] = d;
    }
  return rows[a.length][b.length];
}
