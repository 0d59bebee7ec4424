/** Number formatting shared by messages, fixes and output. Never prints NaN or Infinity. */
export function formatNumber(value: number, decimals: number): string {
  if (!Number.isFinite(value)) return '—';
  const fixed = value.toFixed(decimals < 0 ? 0 : decimals > 6 ? 6 : decimals);
  // A negative number that rounds to zero prints as 0, not -0.
  return fixed.charCodeAt(0) === 45 && Number(fixed) === 0 ? fixed.slice(1) : fixed;
}

/** A number with as few decimals as it needs, up to `max` (29.5, 30, 0.21). */
export function formatShort(value: number, max = 2): string {
  if (!Number.isFinite(value)) return '—';
  return String(Number(value.toFixed(max)));
}

/**
 * Decimals at which `value` shows on the same side of every threshold given as it is: from
 * `decimals` up to 2 more. A PaO2 of 59.6 against 60 shows as 59.6, not as 60 next to "below 60".
 * Up to four thresholds, passed one by one (no list per call: readings run at every gas).
 */
export function decimalsAgainst(value: number, decimals: number, t1: number, t2 = NaN, t3 = NaN, t4 = NaN): number {
  if (!Number.isFinite(value)) return decimals;
  // Compared as written on paper: a quotient that is on a threshold stays on it (see forBand).
  const exact = Math.round(value * 1e9) / 1e9;
  for (let d = decimals; d < decimals + 2; d++) {
    if (keepsSide(value, exact, d, t1) && keepsSide(value, exact, d, t2) && keepsSide(value, exact, d, t3) && keepsSide(value, exact, d, t4)) return d;
  }
  return decimals + 2;
}

/** Whether `value` shown with `d` decimals is on the same side of `t` as it is (NaN: no threshold). */
function keepsSide(value: number, exact: number, d: number, t: number): boolean {
  if (Number.isNaN(t)) return true;
  // Rounding moves a number by half a unit of its last decimal at most: far enough away, no text is needed.
  if (Math.abs(exact - t) > 0.6 * 10 ** -d) return true;
  const shown = Number(value.toFixed(d < 0 ? 0 : d > 6 ? 6 : d));
  return Math.sign(shown - t) === Math.sign(exact - t);
}

/** `value` with `decimals`, or more where fewer would put it on the wrong side of a threshold (up to four). */
export function formatAgainst(value: number, decimals: number, t1: number, t2 = NaN, t3 = NaN, t4 = NaN): string {
  return formatNumber(value, decimalsAgainst(value, decimals, t1, t2, t3, t4));
}

/** `low–high`, both ends with one number of decimals: the fewest that keep `observed` on its side of each. */
export function rangeAgainst(low: number, high: number, decimals: number, observed: number): string {
  const d = Math.max(decimalsAgainst(low, decimals, observed), decimalsAgainst(high, decimals, observed));
  return `${formatNumber(low, d)}–${formatNumber(high, d)}`;
}

/**
 * `a`, `a and b`, `a, b and c`: a list as a sentence writes it, each item once (`or` for choices:
 * `mmHg or kPa`).
 */
export function wordList(items: readonly string[], last: 'and' | 'or' = 'and'): string {
  const once = [...new Set(items)];
  if (once.length <= 1) return once[0] ?? '';
  return `${once.slice(0, -1).join(', ')} ${last} ${once[once.length - 1]}`;
}
