/**
 * Text from a note (labels, prose, words, file names, messages that quote them) shown on a
 * terminal with its control characters made visible: an escape sequence in a note must not clear
 * the screen, retitle the window or colour what follows. Each C0 control character but tab, DEL
 * and each C1 control character is written as `\xHH` (ESC as `\x1b`). Only the text renderers need
 * this; JSON, SARIF and CSV are written by their own encoders.
 */

const CONTROL = /[\u0000-\u0008\u000a-\u001f\u007f-\u009f]/g;
const ANY_CONTROL = /[\u0000-\u0008\u000a-\u001f\u007f-\u009f]/;

const escaped = (c: string): string => `\\x${c.charCodeAt(0).toString(16).padStart(2, '0')}`;

/** The text with its control characters (except tab) written as `\xHH`. */
export function visible(text: string): string {
  return ANY_CONTROL.test(text) ? text.replace(CONTROL, escaped) : text;
}
