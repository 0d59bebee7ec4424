/**
 * The digits of |value| to `d` decimals as on paper, for tests that check rounding against text
 * rather than arithmetic: first to 9 decimals past the last (so 19.949999999999996, binary for
 * 19.95, is 19.95), then halves away from zero. No sign: each caller writes its own.
 */
export function unsignedOnPaper(value: number, d: number): string {
  const long = Math.abs(value).toFixed(d + 9);
  const point = long.indexOf('.');
  const digits = (long.slice(0, point) + long.slice(point + 1, point + 1 + d)).split('').map(Number);
  if (Number(long.charAt(point + 1 + d)) >= 5) {
    let k = digits.length - 1;
    while (k >= 0 && digits[k] === 9) digits[k--] = 0;
    if (k < 0) digits.unshift(1);
    else digits[k]! += 1;
  }
  const whole = digits.slice(0, digits.length - d).join('').replace(/^0+(?=\d)/, '');
  return d === 0 ? whole : `${whole}.${digits.slice(digits.length - d).join('')}`;
}
