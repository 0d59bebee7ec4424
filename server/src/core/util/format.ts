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
