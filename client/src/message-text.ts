/**
 * Text from a note or a file name put into what VS Code shows: a notification, a panel's title,
 * the status bar. VS Code turns `[label](command:…)`, `[label](https:…)` and `[label](file:…)` in a
 * notification's message into a link, and a click on a `command:` link runs that command with the
 * arguments in the link: a file named `[Retry](command:workbench.action.terminal.sendSequence?…).pneu`
 * would offer one. Characters that reorder or hide text (U+202E, zero-width spaces, controls) are
 * written as escapes (`\u{202E}`), as the language server writes its messages.
 */
import { shownEscaped } from '../../server/src/core/util/format';

/**
 * Text for a notification's message: reordering and invisible characters escaped (`shownEscaped`,
 * which titles and the status bar use as it is), and never a link. A zero-width space between
 * `]` and `(` keeps `[a](b)` from reading as a link and shows the name unchanged.
 */
export function inMessage(text: string): string {
  return shownEscaped(text).replace(/\]\(/g, ']\u200b(');
}
