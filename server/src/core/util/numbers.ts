/**
 * A number as V8 keeps it most cheaply. A whole number in the 31-bit range can be held in place
 * wherever it is stored (an object field, an array); any other number, or a whole number that
 * arithmetic left as a floating-point result, is held in a box of its own. A big note keeps tens
 * of thousands of numbers, most of them whole (heart rates, pressures, positions in a line).
 * The value is the same number either way (`-0` stays `-0`).
 */
export function compact(n: number): number {
  const i = n | 0;
  return i === n && (i !== 0 || 1 / n > 0) ? i : n;
}
