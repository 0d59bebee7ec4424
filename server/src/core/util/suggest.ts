/** Did-you-mean suggestions by edit distance (optimal string alignment), bounded and cheap. */

export function editDistance(a: string, b: string, limit = 3): number {
  if (Math.abs(a.length - b.length) > limit) return limit + 1;
  if (a.length > 64 || b.length > 64) return a === b ? 0 : limit + 1;
  const rows = a.length + 1;
  const cols = b.length + 1;
  const d: number[] = new Array<number>(rows * cols).fill(0);
  for (let i = 0; i < rows; i++) d[i * cols] = i;
  for (let j = 0; j < cols; j++) d[j] = j;
  for (let i = 1; i < rows; i++) {
    for (let j = 1; j < cols; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(d[(i - 1) * cols + j]! + 1, d[i * cols + j - 1]! + 1, d[(i - 1) * cols + j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, d[(i - 2) * cols + j - 2]! + 1);
      d[i * cols + j] = v;
    }
  }
  return d[rows * cols - 1]!;
}

/** The closest candidates (at most `max`), nearest first; ties keep the candidates' order. */
export function closest(word: string, candidates: readonly string[], max = 3): string[] {
  const w = word.toLowerCase();
  const limit = w.length <= 3 ? 1 : 2;
  const scored: { c: string; d: number; i: number }[] = [];
  candidates.forEach((c, i) => {
    const d = editDistance(w, c.toLowerCase(), limit);
    if (d <= limit && d > 0) scored.push({ c, d, i });
  });
  scored.sort((x, y) => x.d - y.d || x.i - y.i);
  const out: string[] = [];
  for (const s of scored) if (!out.includes(s.c)) out.push(s.c);
  return out.slice(0, max);
}
