/** What the de-identification detectors find: a kind of identifier and where it is. */
import type { Span } from '../syntax/tree';

export type PrivacyKind = 'name' | 'birth-date' | 'calendar-date' | 'phone' | 'email' | 'record-number' | 'postal-code';

export interface PrivacyMatch {
  readonly kind: PrivacyKind;
  /** Span of the identifier within the scanned text (the cue word, if any, is not part of it). */
  readonly span: Span;
  readonly text: string;
  /** The cue that made it an identifier (`name`, `Dr`, `DOB`, `MRN`, `tel` …), or null for a shape alone. */
  readonly cue: string | null;
}

/** The placeholder a fix writes in place of each kind of identifier. */
export const PLACEHOLDERS: Readonly<Record<PrivacyKind, string>> = {
  'name': '[name]',
  'birth-date': '[date of birth]',
  'calendar-date': '[date]',
  'phone': '[phone]',
  'email': '[email]',
  'record-number': '[id]',
  'postal-code': '[postcode]',
};

/**
 * Which match wins when two overlap with the same span (a longer match always wins first).
 * Higher wins.
 */
export const KIND_PRIORITY: Readonly<Record<PrivacyKind, number>> = {
  'email': 7,
  'birth-date': 6,
  'calendar-date': 5,
  'record-number': 4,
  'phone': 3,
  'postal-code': 2,
  'name': 1,
};

export function match(kind: PrivacyKind, text: string, start: number, end: number, cue: string | null): PrivacyMatch {
  return { kind, span: { start, end }, text: text.slice(start, end), cue };
}
