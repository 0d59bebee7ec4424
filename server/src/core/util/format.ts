/** Number formatting shared by messages, fixes and output. Never prints NaN or Infinity. */
export function formatNumber(value: number, decimals: number): string {
  if (!Number.isFinite(value)) return '—';
  const d = decimals < 0 ? 0 : decimals > 6 ? 6 : decimals;
  // A whole number (most values a note states: hr 84, peep 10) is written without toFixed, which
  // is the dearest step of formatting; the text is the same (String(-0) is '0', as wanted).
  if (Number.isInteger(value) && value < 1e21 && value > -1e21 && Number.isInteger(d)) return d === 0 ? String(value) : String(value) + ZEROS[d]!;
  const places = Number.isInteger(d) ? d : Math.trunc(d);
  const size = value < 0 ? -value : value;
  const units = size * SCALE[places]!;
  if (units < 1e6) {
    // Rounded as on paper: a number that is a half of its last decimal but for binary noise
    // (0.686 × 25 = 17.15, computed 17.149999999999995) is that half, and a half goes away from
    // zero (17.2), where toFixed rounds the binary number (17.1). Taken first to 9 decimals past
    // the last one shown, as bands take values (`forBand`).
    const whole = Math.round(Math.round(units * 1e9) / 1e9);
    // A number that rounds to zero prints as 0, never -0.
    if (whole === 0) return places === 0 ? '0' : `0${ZEROS[places]!}`;
    const text = places === 0 ? String(whole) : (whole / SCALE[places]!).toFixed(places);
    return value < 0 ? `-${text}` : text;
  }
  const fixed = value.toFixed(d);
  // A negative number that rounds to zero prints as 0, not -0.
  return fixed.charCodeAt(0) === 45 && Number(fixed) === 0 ? fixed.slice(1) : fixed;
}

/** The decimals a whole number is written with, by count (0 to 6). */
const ZEROS: readonly string[] = ['', '.0', '.00', '.000', '.0000', '.00000', '.000000'];
/** 10 to the power of each count of decimals (0 to 6). */
const SCALE: readonly number[] = [1, 10, 100, 1000, 1e4, 1e5, 1e6];

/** A number with as few decimals as it needs, up to `max` (29.5, 30, 0.21). */
export function formatShort(value: number, max = 2): string {
  if (!Number.isFinite(value)) return '—';
  return String(Number(formatNumber(value, max)));
}

/**
 * An age in years as people read it beside `y`: two decimals (8 months is 0.67 y, 30 months 2.5 y;
 * trailing zeros dropped), and under a year two significant digits, up to four decimals, so an age
 * written in weeks or days is not shown as 0 y (3 days is 0.0082 y, 1 day 0.0027 y, 6 weeks 0.11 y).
 */
export function formatAgeYears(years: number): string {
  if (!(years > 0 && years < 1)) return formatShort(years, 2);
  return formatShort(years, Math.min(AGE_MAX_DECIMALS, Math.max(2, 1 - Math.floor(Math.log10(years)))));
}

/** Decimals of an age in years at most: a day is 0.0027 y. */
const AGE_MAX_DECIMALS = 4;

/**
 * Decimals at which `value` shows on the same side of every threshold given as it is: from
 * `decimals` up to as many as it takes (6 at most). A PaO2 of 59.6 against 60 shows as 59.6, not
 * as 60 next to "below 60"; a range end of 26.995 against 27 as 26.995, where 27.00 would put it
 * on 27. Up to five thresholds, passed one by one (no list per call: readings run at every gas),
 * and counted together: the larger of two counts, each against a part of them, is not enough (49.61
 * keeps its side of an end shown as 49.6 with no decimal and of 50 with one, yet with one it is
 * shown as that end).
 */
export function decimalsAgainst(value: number, decimals: number, t1: number, t2 = NaN, t3 = NaN, t4 = NaN, t5 = NaN): number {
  if (!Number.isFinite(value)) return decimals;
  // Compared as written on paper: a quotient that is on a threshold stays on it (see forBand).
  const exact = Math.round(value * 1e9) / 1e9;
  const most = Math.max(decimals, 6);
  for (let d = decimals; d < most; d++) {
    if (keepsSide(value, exact, d, t1) && keepsSide(value, exact, d, t2) && keepsSide(value, exact, d, t3) && keepsSide(value, exact, d, t4) && keepsSide(value, exact, d, t5)) return d;
  }
  return most;
}

/** Whether `value` shown with `d` decimals is on the same side of `t` as it is (NaN: no threshold). */
function keepsSide(value: number, exact: number, d: number, t: number): boolean {
  if (Number.isNaN(t)) return true;
  // The threshold as on paper too: a PaCO2 of 2.20 kPa converted to mmHg and back is
  // 2.1999999999999997, beside which an end of 2.2198 kPa shown as 2.2 would seem above it.
  const onPaper = Math.round(t * 1e9) / 1e9;
  // Rounding moves a number by half a unit of its last decimal at most: far enough away, no text is needed.
  if (Math.abs(exact - onPaper) > 0.6 * 10 ** -d) return true;
  const shown = Number(formatNumber(value, d));
  return Math.sign(shown - onPaper) === Math.sign(exact - onPaper);
}

/** `value` with `decimals`, or more where fewer would put it on the wrong side of a threshold (up to four). */
export function formatAgainst(value: number, decimals: number, t1: number, t2 = NaN, t3 = NaN, t4 = NaN): string {
  return formatNumber(value, decimalsAgainst(value, decimals, t1, t2, t3, t4));
}

/**
 * Decimals (from `decimals`, 6 at most) at which `value` and `end`, both shown with them, are in the
 * order they are in (NaN `end`: none to keep apart): a PaCO2 of 26.10 mmHg and the end 26.05 of a
 * range it is above show as 26.10 and 26.05, not both as 26.1 (or 26). Both numbers are shown with
 * the decimals this gives, so neither is read on the other side of the other.
 */
export function decimalsApart(value: number, decimals: number, end: number): number {
  if (Number.isNaN(end) || !Number.isFinite(value)) return decimals;
  const side = Math.sign(Math.round((end - value) * 1e9));
  for (let d = decimals; d < 6; d++) {
    if (Math.sign(Number(formatNumber(end, d)) - Number(formatNumber(value, d))) === side) return d;
  }
  return Math.max(decimals, 6);
}

/**
 * `value` with `decimals`, rounded away from the middle of a range it is the `end` of (down for its
 * low end, up for its high end): the end of an expected PaCO2 that a PaCO2 written in kPa is on at
 * the resolution it was written with, in mmHg, where the PaCO2's own mmHg can be just beyond it
 * (4.7 kPa, 35.25 mmHg, on a low end of 35.55: `35–40 mmHg`, not `36–40` beside `(35 mmHg)`).
 */
export function formatOutward(value: number, decimals: number, end: 'low' | 'high'): string {
  if (!Number.isFinite(value)) return '—';
  const d = decimals < 0 ? 0 : decimals > 6 ? 6 : Math.trunc(decimals);
  // On paper first (see forBand): 36.000000000000004 is 36, not 37, rounded up.
  const units = Math.round(value * SCALE[d]! * 1e9) / 1e9;
  return formatNumber((end === 'low' ? Math.floor(units) : Math.ceil(units)) / SCALE[d]!, d);
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

/**
 * Characters that could make text from a note or a file name show something other than what it
 * holds, always written escaped by `shownEscaped`: each C0 control but tab, DEL and each C1
 * control (an escape sequence must not clear a terminal or colour what follows); the
 * bidirectional controls (the embeddings and overrides U+202A–U+202E, the isolates U+2066–U+2069,
 * the marks U+200E, U+200F and U+061C), which reorder a line; the line and paragraph separators
 * U+2028 and U+2029 (some terminals break the line there); and the invisible U+200B (zero-width
 * space), U+00AD (soft hyphen), U+2060 (word joiner), U+2061–U+2064 (invisible operators) and
 * U+FEFF (zero-width no-break space), so that `h\u{200B}r` does not read as `hr` in "is not a key".
 */
const ALWAYS_ESCAPED = '\\u0000-\\u0008\\u000a-\\u001f\\u007f-\\u009f\\u00ad\\u061c\\u200b\\u200e\\u200f\\u202a-\\u202e\\u2066-\\u2069\\u2028\\u2029\\u2060-\\u2064\\ufeff';
/**
 * A character beside which the zero-width joiner (U+200D) or non-joiner (U+200C) can be needed: a
 * mark (an Indic virama, an emoji's variation selector), an emoji or skin tone, or a letter of a
 * script other than Latin, Greek and Cyrillic (Arabic and Persian words, Indic conjuncts).
 */
const JOINABLE = '[\\p{M}\\p{Extended_Pictographic}\\p{Emoji_Modifier}]|(?![\\p{Script=Latin}\\p{Script=Greek}\\p{Script=Cyrillic}])\\p{L}';
/**
 * What `shownEscaped` writes escaped: the characters above, and a joiner that is not between two
 * characters that can need it (`h\u{200D}r`, a joiner at either end or beside a digit, a space
 * or another joiner). Joiners inside an emoji (👩‍⚕️) or a word of a script that uses them are kept.
 */
const SHOWN_ESCAPED = new RegExp(`[${ALWAYS_ESCAPED}]|(?<!${JOINABLE})[\\u200c\\u200d]|[\\u200c\\u200d](?!${JOINABLE})`, 'gu');
const MAYBE_ESCAPED = new RegExp(`[${ALWAYS_ESCAPED}\\u200c\\u200d]`, 'u');

/**
 * A character's code written out as text output shows it: control characters as `\xHH` (ESC as
 * `\x1b`), the others (format characters, lone surrogates) as `\u{HHHH}`.
 */
export function escapedCode(code: number): string {
  return code < 0xa0 ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u{${code.toString(16).toUpperCase().padStart(4, '0')}}`;
}

const escapedChar = (c: string): string => escapedCode(c.charCodeAt(0));

/**
 * Text from a note (labels, prose, words, file names, messages that quote them) as a person should
 * see it: the characters of `SHOWN_ESCAPED` written as `\xHH` (controls) or `\u{HHHH}`, everything
 * else as it is (letters of every script, emoji with their joiners). For text shown on a terminal
 * or in an editor's list of problems; data formats (JSON, SARIF, CSV) keep the text as written.
 */
export function shownEscaped(text: string): string {
  return MAYBE_ESCAPED.test(text) ? text.replace(SHOWN_ESCAPED, escapedChar) : text;
}

/** The most decimals among the numbers of a value's text (`7.5` → 1, `0.355` → 3, `7,25` → 2, `120/80` → 0). */
export function writtenDecimals(text: string): number {
  let most = 0;
  let run = -1;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x2e || c === 0x2c) run = 0;
    else if (c >= 0x30 && c <= 0x39) {
      if (run >= 0 && ++run > most) most = run;
    } else run = -1;
  }
  return most;
}

/**
 * Half a unit of the last decimal a number was written with (`6.7` → 0.05, `150` → 0.5): how far
 * what it stands for can be from it. `atLeast` decimals are assumed where fewer were written.
 */
export function halfLastDigit(text: string, atLeast = 0): number {
  return 0.5 * 10 ** -Math.max(atLeast, writtenDecimals(text));
}
