/**
 * E-mail addresses: `local@domain.tld`. Found from each `@` by scanning outwards over the
 * characters an address may hold (bounded lengths), then checking the domain has a dot and a
 * top-level part of letters. A timepoint's `@` has a blank before it, so it never matches.
 */
import { isAlnumAt, isLetterAt } from './text';
import { match, type PrivacyMatch } from './types';

const MAX_LOCAL = 64;
const MAX_DOMAIN = 253;

function isAsciiAlnumAt(text: string, i: number): boolean {
  const c = text.charCodeAt(i);
  return (c >= 0x30 && c <= 0x39) || (c >= 0x41 && c <= 0x5a) || (c >= 0x61 && c <= 0x7a);
}

function isLocalCharAt(text: string, i: number): boolean {
  if (isAsciiAlnumAt(text, i)) return true;
  const ch = text.charAt(i);
  return ch === '.' || ch === '_' || ch === '%' || ch === '+' || ch === '-';
}

function isDomainCharAt(text: string, i: number): boolean {
  return isAsciiAlnumAt(text, i) || text.charAt(i) === '.' || text.charAt(i) === '-';
}

/** Adds the e-mail addresses in `text` to `out`. */
export function findEmails(text: string, out: PrivacyMatch[]): void {
  let from = 0;
  for (;;) {
    const at = text.indexOf('@', from);
    if (at < 0) break;
    from = at + 1;
    // Local part, leftwards.
    let start = at;
    while (start > 0 && at - start < MAX_LOCAL && isLocalCharAt(text, start - 1)) start--;
    while (start < at && text.charAt(start) === '.') start++;
    if (start === at || text.charAt(at - 1) === '.') continue;
    // Domain, rightwards.
    let end = at + 1;
    while (end < text.length && end - at - 1 < MAX_DOMAIN && isDomainCharAt(text, end)) end++;
    while (end > at + 1 && (text.charAt(end - 1) === '.' || text.charAt(end - 1) === '-')) end--;
    const domain = text.slice(at + 1, end);
    const labels = domain.split('.');
    const tld = labels[labels.length - 1] ?? '';
    if (labels.length < 2 || labels.some((l) => l.length === 0) || tld.length < 2) continue;
    let tldLetters = true;
    for (let i = 0; i < tld.length; i++) if (!isLetterAt(tld, i)) tldLetters = false;
    if (!tldLetters) continue;
    // Not glued to more word characters (e.g. a longer token we cannot read).
    if (isAlnumAt(text, end)) continue;
    out.push(match('email', text, start, end, null));
    from = end;
  }
}
