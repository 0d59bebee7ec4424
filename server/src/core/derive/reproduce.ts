/**
 * A formula with its numbers put in that gives the value it shows. Each input is shown with its
 * own decimals (`71`, `0.40`) where that is enough; where redoing the arithmetic with the numbers
 * shown would not give the result shown to its decimals (`50.0 + 0.91 × (180 − 152.4) = 75.0`,
 * which is 75.1), the inputs that are not whole get one more decimal, then another, up to four
 * more (`50.0 + 0.91 × (179.83 − 152.4) = 75.0`).
 *
 * The arithmetic is read from the text itself (`evaluateArithmetic`): numbers, `+ − × ÷ ^` and
 * brackets, with `± k` at the end for a range. A text with anything else (words, `|`, `…`,
 * `exp`) is shown with each input's own decimals, as it was before.
 */
import { formatNumber } from '../util/format';
import type { Term } from './model';

/** Parser state of one evaluation: the text and where the reader is. */
class Reader {
  pos = 0;
  constructor(readonly text: string) {}

  skip(): void {
    while (this.pos < this.text.length && this.text.charCodeAt(this.pos) === 0x20) this.pos++;
  }

  /** The next character after blanks, without taking it ('' at the end). */
  peek(): string {
    this.skip();
    return this.text.charAt(this.pos);
  }
}

const MINUS = new Set(['-', '−']);

/** expr := term (('+' | '−') term)* */
function expression(r: Reader): number | null {
  let value = term(r);
  while (value !== null) {
    const c = r.peek();
    if (c === '+' || MINUS.has(c)) {
      r.pos++;
      const right = term(r);
      if (right === null) return null;
      value = c === '+' ? value + right : value - right;
    } else break;
  }
  return value;
}

/** term := power (('×' | '÷') power)* */
function term(r: Reader): number | null {
  let value = power(r);
  while (value !== null) {
    const c = r.peek();
    if (c === '×' || c === '÷') {
      r.pos++;
      const right = power(r);
      if (right === null) return null;
      value = c === '×' ? value * right : value / right;
    } else break;
  }
  return value;
}

/** power := unary ('^' power)?   (right-associative; `10^(7.35 − 6.1)`) */
function power(r: Reader): number | null {
  const base = unary(r);
  if (base === null) return null;
  if (r.peek() !== '^') return base;
  r.pos++;
  const exponent = power(r);
  return exponent === null ? null : base ** exponent;
}

/** unary := '−' unary | '(' expr ')' | number */
function unary(r: Reader): number | null {
  const c = r.peek();
  if (MINUS.has(c)) {
    r.pos++;
    const v = unary(r);
    return v === null ? null : -v;
  }
  if (c === '(') {
    r.pos++;
    const v = expression(r);
    if (v === null || r.peek() !== ')') return null;
    r.pos++;
    return v;
  }
  const start = r.pos;
  while (r.pos < r.text.length) {
    const code = r.text.charCodeAt(r.pos);
    if ((code >= 0x30 && code <= 0x39) || code === 0x2e) r.pos++;
    else break;
  }
  if (r.pos === start) return null;
  const n = Number(r.text.slice(start, r.pos));
  return Number.isFinite(n) ? n : null;
}

/**
 * The value of a formula with its numbers put in (`0.40 × (760 − 47)`), or of a range
 * (`1.5 × 24 + 8 ± 2` gives its two ends); null when the text is not plain arithmetic.
 */
export function evaluateArithmetic(text: string): { readonly low: number; readonly high: number } | null {
  const r = new Reader(text);
  const value = expression(r);
  if (value === null || !Number.isFinite(value)) return null;
  if (r.peek() === '±') {
    r.pos++;
    const spread = expression(r);
    if (spread === null || r.peek() !== '') return null;
    return { low: value - spread, high: value + spread };
  }
  return r.peek() === '' ? { low: value, high: value } : null;
}

/** Decimals added to the inputs at most, to make the formula give the value shown. */
const MAX_EXTRA = 4;

/**
 * The formula `template` with the numbers of `terms` put in by `show(term, extra)` (the term with
 * `extra` decimals more than its own), with the fewest extra decimals (0 to 4) at which the
 * arithmetic gives `result` (the value as shown, or a range `low–high`) to `decimals`. A term
 * shown exactly with its own decimals (`760`, `0.40`) is never given more by `show` callers that
 * follow `termWithExtra`.
 */
export function reproducingSubstitution(
  template: string,
  terms: readonly Term[],
  substitute: Substitute,
  show: (t: Term, extra: number) => string,
  result: string,
  decimals: number,
): string {
  const extra = reproducingExtra(template, terms, substitute, show, result, decimals);
  return substitute(template, terms, (t) => show(t, extra));
}

type Substitute = (template: string, terms: readonly Term[], show: (t: Term) => string) => string;

/**
 * The extra decimals `reproducingSubstitution` gives the inputs (0 to 4): the fewest at which the
 * arithmetic gives `result`; 0 when none does (an A–a gradient within rounding of 0 is shown as
 * 0, and its notes say so) or the text is not arithmetic.
 */
export function reproducingExtra(template: string, terms: readonly Term[], substitute: Substitute, show: (t: Term, extra: number) => string, result: string, decimals: number): number {
  if (gives(substitute(template, terms, (t) => show(t, 0)), result, decimals)) return 0;
  for (let extra = 1; extra <= MAX_EXTRA; extra++) {
    if (gives(substitute(template, terms, (t) => show(t, extra)), result, decimals)) return extra;
  }
  return 0;
}

/** Whether the arithmetic of `text` gives `result` (one number, or `low–high`) to `decimals`; true when it cannot be redone. */
function gives(text: string, result: string, decimals: number): boolean {
  const value = evaluateArithmetic(text);
  if (value === null) return true;
  const dash = result.indexOf('–');
  if (dash < 0) return formatNumber(value.low, decimals) === result;
  return `${formatNumber(value.low, decimals)}–${formatNumber(value.high, decimals)}` === result;
}

/**
 * A term's number with `extra` decimals more than its own, but never more than its value needs:
 * a number that is whole or exact at its own decimals keeps them (`760`, `0.40`, `7.35`).
 */
export function termWithExtra(value: number, decimals: number, extra: number): string {
  const own = formatNumber(value, decimals);
  if (extra === 0 || Number.isInteger(value)) return own;
  // Exact at its own decimals, as far as a number written on paper is (forBand's 9 decimals).
  if (Math.abs(Number(own) - value) < 5e-10) return own;
  // The decimals added, less the zeros they end with (179.832, not 179.8320).
  const more = formatNumber(value, decimals + extra);
  const point = more.indexOf('.');
  if (point < 0) return more;
  let end = more.length;
  while (end > point + 1 + decimals && more.charCodeAt(end - 1) === 0x30) end--;
  return more.charCodeAt(end - 1) === 0x2e ? more.slice(0, end - 1) : more.slice(0, end);
}
