/** Helpers for the privacy tests: run the checks on one line and list the privacy findings. */
import { checkNote } from '../../server/src/core/check-note';
import type { Settings } from '../../server/src/core/settings';

export interface PrivacyHit {
  readonly code: string;
  /** The text the finding's range covers. */
  readonly text: string;
}

export function isPrivacyCode(code: string): boolean {
  return /^PN5\d\d$/.test(code);
}

/** Privacy findings of a note, as code and covered text, in position order. */
export function privacyHits(note: string, settings: Partial<Settings> = {}): PrivacyHit[] {
  const lines = note.split(/\r\n|\r|\n/);
  return checkNote(note, settings).findings
    .filter((f) => isPrivacyCode(f.code))
    .map((f) => ({ code: f.code, text: (lines[f.range.start.line] ?? '').slice(f.range.start.character, f.range.end.character) }));
}

/** Privacy findings of a phrase written as the prose of a `note` line. */
export function hitsInProse(phrase: string, settings: Partial<Settings> = {}): PrivacyHit[] {
  return privacyHits(`note      ${phrase}`, settings);
}
