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
 * seem to print a line of its own) and the invisible U+200B, U+00AD, U+2060–U+2064 and U+FEFF
 * (`h\u{200B}r` must not look like `hr` in "is not a key"). The joiners U+200C and U+200D are
 * written escaped too unless they sit between characters that can need them (in an emoji, in a
 * word of Arabic or an Indic script): `h\u{200D}r`, but 👩‍⚕️ as it is. The rules are the core's
 * (`shownEscaped` in core/util/format.ts), which the language server applies to the messages it
 * sends too. Only the text renderers need this; JSON, SARIF and CSV are written by their own
 * encoders and keep these characters as data.
 */
import { shownEscaped } from '../core/util/format';

/** The text with its control characters (except tab) as `\xHH`, and its bidirectional controls, separators and invisible characters as `\u{HHHH}`. */
export function visible(text: string): string {
  return shownEscaped(text);
}
