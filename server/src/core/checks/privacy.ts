/**
 * Privacy checks (PN5xx): what looks like a person's identifiers in the free text of a note
 * (comments, note prose, timepoint labels, lines that are not sections, and free words and
 * unread text on item lines). The format never needs them, and notes travel as teaching
 * material and datasets. One check per kind of identifier, so each can be switched off alone;
 * the setting `privacyChecks: false` switches them all off. The detectors live in ../privacy.
 */
import { scanLine } from '../privacy/free-text';
import { PLACEHOLDERS, type PrivacyKind, type PrivacyMatch } from '../privacy/types';
import { toRange, type LineNode } from '../syntax/tree';
import type { Fix } from '../types';
import { defineCheck, headerLineCount, type CheckContext, type CheckDef, type CheckDoc, type TimepointContext } from './check';
import type { Kept } from '../util/small-store';
import { NONE } from '../util/lists';

const SOURCE = 'de-identification practice (common practice, no source); HIPAA Safe Harbor list of identifiers, 45 CFR 164.514(b)(2), its eighteen kinds from (A) names to (R) any other unique identifying number read in their quotation at johndcook.com/blog/hipaa-identifiers-explained (the regulation itself not read)';

function placeholderFix(line: number, m: PrivacyMatch): Fix {
  const placeholder = PLACEHOLDERS[m.kind];
  return {
    title: `Replace \`${m.text}\` with ${placeholder}`,
    edits: [{ range: toRange(line, m.span), newText: placeholder }],
  };
}

interface LineMatch {
  readonly line: number;
  readonly match: PrivacyMatch;
}

/** The identifiers on lines `[start, end)`. */
function scanLines(lines: readonly LineNode[], start: number, end: number): readonly LineMatch[] {
  let found: LineMatch[] | null = null;
  for (let i = start; i < end && i < lines.length; i++) {
    const node = lines[i]!;
    if (node.kind === 'blank' && !node.comment) continue;
    const matches = scanLine(node);
    // Indexed loops: these run for every line and every check, and most lists are empty.
    for (let k = 0; k < matches.length; k++) (found ??= []).push({ line: node.line, match: matches[k]! });
  }
  return found ?? NONE;
}

/**
 * The seven checks share one scan of each group of lines (`ctx.shared`): the first check to ask
 * scans the header or the timepoint, and the others read.
 */
const HEADER_MATCHES: Kept<readonly LineMatch[], CheckContext> = {
  name: 'identifiers in the header',
  compute: (ctx) => scanLines(ctx.analysis.tree.lines, 0, headerLineCount(ctx.analysis)),
};

const TIMEPOINT_MATCHES: Kept<readonly LineMatch[], TimepointContext> = {
  name: 'identifiers in the timepoint',
  compute: (ctx) => scanLines(ctx.analysis.tree.lines, ctx.timepoint.startLine, ctx.timepoint.endLine + 1),
};

/**
 * A timepoint's lines are checked in `runTimepoint` (so an editing session keeps the findings
 * of unchanged timepoints), and the lines outside every timepoint (the header before the
 * first `@`) in `run`.
 */
function privacyCheck(code: string, alias: string, kind: PrivacyKind, title: string, doc: CheckDoc, message: (m: PrivacyMatch) => string): CheckDef {
  const report = (ctx: CheckContext, matches: readonly LineMatch[]) => {
    for (let k = 0; k < matches.length; k++) {
      const { line, match: m } = matches[k]!;
      if (m.kind !== kind) continue;
      ctx.report({ range: toRange(line, m.span), message: message(m), fixes: [placeholderFix(line, m)] });
    }
  };
  return defineCheck({
    code, alias, title, severity: 'warning', tags: ['privacy'], doc, source: SOURCE,
    run(ctx) {
      if (!ctx.settings.privacyChecks) return;
      // Timepoints cover every line from the first one's start to the end of the note: the
      // note-scoped part is the header before it (the timepoints are checked one by one below).
      report(ctx, ctx.shared(HEADER_MATCHES));
    },
    runTimepoint(ctx) {
      if (!ctx.settings.privacyChecks) return;
      report(ctx, ctx.shared(TIMEPOINT_MATCHES));
    },
  });
}

const OFF = 'The privacy checks can be switched off together with the setting `privacyChecks: false`, or one by one with `disabledChecks`.';
const after = (m: PrivacyMatch) => (m.cue ? ` (after \`${m.cue}\`)` : '');

export const possibleName = privacyCheck('PN501', 'possible-name', 'name', 'Possible person name', {
  fires: 'Capitalised words (or words in capitals such as `ROE`, not known abbreviations such as `ICU`) follow a cue for a person: a title (`Mr`, `Mrs`, `Ms`, `Miss`, `Mx`, `Dr`, `Prof`; in lower case, `mr`, `mrs`, `dr` and `prof` count only with a capitalised name right after them, so `seen by dr Patel` counts and `mod mr, Severe AS` or `chest dr Removed` do not; `Mx` with a colon heads a management plan), `name`, `named`, `known as`, a relative (`wife`, `son`, `next of kin` …), `carer`, `nurse` (`seen by Nurse Jones`; not `Nurse Practitioner`, `Nurse Led`), or, with two words at least, `patient`, `pt`, `called`, `seen by`, `discussed with`, and a relative followed by `:` or `-` (`Mother - Asthma`; a comma after a relative ends the cue). One capitalised word after a relative and `:` or `-` counts when nothing but a mark or a number follows it (`wife: Mary`, `daughter - Anne, 07700 900123`; not `Mother: Breast cancer`), when it has no ending of a disease (`Sarcoidosis`, `Glaucoma`, `Anaemia`, `Autism`) and when no history heading (`FHx`, `SH`, `family`, `social`) comes before it on the line. Titles in capitals (`MR`, `MRS`, `MS`, `DR`, `PROF`) are also abbreviations (mitral regurgitation, multiple sclerosis, a doctor in shorthand): they count only with names in capitals right after them, after blanks alone (`MR SMITH`, `MS JANE ROE`; not `MR severe` or `MR, AS`), not after a grade or a history word (`mod MR`, `known MS`), and not before a known abbreviation (`MR ECHO`, `DR ABG`), a common clinical word (`MR SEVERE`, `MS FLARE`, `MR ANGIO`, `DR REVIEW`, `DR ROUND`) or a past participle of seven letters or more (`DR DELAYED`); a given name that is also a word is not read in capitals (`DR WILL PRESCRIBE`), and `MISS` and `MX` never count. Common capitalised words of clinical prose (`Dr review`, `Dr Advised`, `Patient Settled`, `Occupational Therapy`, `Outreach`) do not count; eponyms (`Glasgow`, `Murray`, `Miller`) count only after a title (`Dr Miller`) or after a given name (`name Jo Allen`). The finding covers the whole name (`Mrs June Roe`, `name: ROE, Jane`, and after `patient` or `pt` a surname in capitals with the given name after its comma: `Patient: SMITH, John`).',
  example: 'note      seen by Dr Patel; name: Jane Roe',
  fix: `Remove the name or write a placeholder (\`[name]\`; the quick fix does it). A note needs no names: \`patient\` takes age, sex, height and weight only. ${OFF}`,
}, (m) => `\`${m.text}\` looks like a person's name${after(m)}; a note needs none. Remove it or write [name].`);

export const birthDate = privacyCheck('PN502', 'birth-date', 'birth-date', 'Date of birth', {
  fires: 'A date (or a year) follows a birth cue: `DOB`, `D.O.B.`, `born`, `date of birth`, `birth date`. Numeric dates with a two-digit year (`12/03/61`) count only here; a written one (`12 Mar 61`) is a calendar date (PN503) without the cue.',
  example: 'note      DOB 12/03/1961',
  fix: `Remove it: the age on the \`patient\` line (\`patient age 64 y\`) is all a note needs. The quick fix writes \`[date of birth]\`. ${OFF}`,
}, (m) => `\`${m.text}\` looks like a date of birth${after(m)}; write the age on the patient line instead (e.g. \`patient age 64 y\`).`);

export const calendarDate = privacyCheck('PN503', 'calendar-date', 'calendar-date', 'Calendar date', {
  fires: 'Free text holds a calendar date: `2026-03-04`, `2026-03-04T08:00`, `04/03/2026`, `4.3.2026`, `20260304`, `4 March 2026`, `March 4, 2026`, `4th of March`, `Mar 2026`, `04-MAR-2026` (a month in capitals only with a year), `4 Mar 26`, `4-Mar-26` (a two-digit year after a day and a month, between blanks or hyphens, covered with them; not a time or a dose: `4 Mar 10:30`, `4 May 10 mg` cover the day and month only; after blanks a month in capitals takes it only after a birth cue). A full stop between a day and a month ends a sentence (`RR 24. May need NIV`). Numeric dates need a four-digit year from 1900 to 2099, so gases (`7.28/56/71`), pressures (`120/80`) and fractions (`3/7`) never count.',
  example: '@ day 2 08:00  seen in clinic on 4 March 2026',
  fix: `Write times relative to the note (\`@ day 2 08:00\`, \`@ +2h30\`): they keep dates of care out of shared notes. The quick fix writes \`[date]\`. ${OFF}`,
}, (m) => `\`${m.text}\` is a calendar date; write a relative day instead (e.g. \`@ day 2 08:00\`), which keeps dates of care out of shared notes.`);

export const phoneNumber = privacyCheck('PN504', 'phone-number', 'phone', 'Phone number', {
  fires: 'Digits in a phone shape: international (`+44 20 7946 0958`), an area code in parentheses (`(555) 010-1234`), a national number of 10 or 11 digits with a leading 0 (`020 7946 0958`, `07700 900123`, `07700900123`), 3-3-4 groups with hyphens or dots (`555-010-1234`), or 7 to 15 digits after `tel`, `phone`, `mobile`, `contact`, `fax`. Numbers followed by a unit (`250 500 1000 mL`) are quantities and never count without a cue.',
  example: 'note      daughter on 07700 900123',
  fix: `Remove it or write \`[phone]\` (the quick fix does it). ${OFF}`,
}, (m) => `\`${m.text}\` looks like a phone number${after(m)}; remove it or write [phone].`);

export const emailAddress = privacyCheck('PN505', 'email-address', 'email', 'E-mail address', {
  fires: 'Free text holds an e-mail address (`name@domain.tld`).',
  example: 'note      results to jane.roe@example.org',
  fix: `Remove it or write \`[email]\` (the quick fix does it). ${OFF}`,
}, (m) => `\`${m.text}\` is an e-mail address; remove it or write [email].`);

export const recordNumber = privacyCheck('PN506', 'record-number', 'record-number', 'Record or identity number', {
  fires: 'A record-number-like identifier: 5 digits or more after `MRN`, `NHS`, `hospital number`, `ID`, `SSN`, `medicare` and similar cues; without a cue, 7 digits or more in one run (`1234567`, not round quantities like `1000000`), 1 to 3 capitals and 6 digits (`AB123456`), a 10-digit NHS number with a valid check digit (`999 123 4578`), or a social security shape (`123-45-6789`). A number followed by a unit is a quantity, even after a cue (`record 12500 mL out`).',
  example: 'note      MRN 1234567',
  fix: `Remove it or write \`[id]\` (the quick fix does it). Link notes to records outside the note, never inside it. ${OFF}`,
}, (m) => `\`${m.text}\` looks like a record or identity number${after(m)}; remove it or write [id].`);

export const postalCode = privacyCheck('PN507', 'postal-code', 'postal-code', 'Postal code', {
  fires: 'A postal code in a shape clinical text does not produce: a UK postcode in capitals (`AA9A 9AA`), a US ZIP+4 (`00345-6789`), a 5-digit ZIP after a comma and a state (`Fernleigham, IL 00427`), or after `postcode`, `zip` or `address` a UK, Canadian or US code in any case.',
  example: 'note      lives near AA9A 9AA',
  fix: `Remove it or write \`[postcode]\` (the quick fix does it). Where altitude matters, the \`place\` line takes it (\`place altitude 1650 m\`). ${OFF}`,
}, (m) => `\`${m.text}\` looks like a postal code${after(m)}; remove it or write [postcode].`);

export const PRIVACY_CHECKS: readonly CheckDef[] = [possibleName, birthDate, calendarDate, phoneNumber, emailAddress, recordNumber, postalCode];
