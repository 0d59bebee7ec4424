/**
 * Text from a note (labels, prose, words, file names, messages that quote them) shown on a
 * terminal with the characters that could change what the terminal shows made visible: an escape
 * sequence in a note must not clear the screen, retitle the window or colour what follows, and a
 * bidirectional control must not reorder the line so that it reads as something the note does not
 * say (`spo2 88` shown as `88 2ops`, or a file name whose end appears at its start). Each C0
 * control character but tab, DEL and each C1 control character is written as `\xHH` (ESC as
 * `\x1b`); each bidirectional control (the embeddings and overrides U+202A–U+202E, the isolates
 * U+2066–U+2069, the marks U+200E, U+200F and U+061C) as `\u{HHHH}`, and so are the line and
 * paragraph separators U+2028 and U+2029 (some terminals break the line there, so a note could
 * seem to print a line of its own) and the invisible U+200B, U+2060 and U+FEFF (`h\u{200B}r` must
 * not look like `hr` in "is not a key"). The joiners U+200C and U+200D stay: scripts and emoji need
 * them. Only the text renderers need this; JSON, SARIF and CSV are written by their own encoders
 * and keep these characters as data.
 */

const SHOWN_ESCAPED = /[\u0000-\u0008\u000a-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069\u2028\u2029\u200b\u2060\ufeff]/g;
const ANY_SHOWN_ESCAPED = /[\u0000-\u0008\u000a-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069\u2028\u2029\u200b\u2060\ufeff]/;

const escaped = (c: string): string => {
  const code = c.charCodeAt(0);
  return code <= 0xff ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u{${code.toString(16).toUpperCase().padStart(4, '0')}}`;
};

/** The text with its control characters (except tab) as `\xHH`, and its bidirectional controls, separators and invisible characters as `\u{HHHH}`. */
export function visible(text: string): string {
  return ANY_SHOWN_ESCAPED.test(text) ? text.replace(SHOWN_ESCAPED, escaped) : text;
}
