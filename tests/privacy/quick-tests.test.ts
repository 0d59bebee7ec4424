// The scan skips work where a text cannot hold an identifier: a detector runs only when the text
// has what its identifiers need (dates a digit, numbers four, postal codes two, names a capital
// after a cue), a part of a line is read in place until the quick test lets it through, and a
// few words are told apart by their length alone. Each test here is the smallest text that still
// raises its kind, at the edge of one of those tests, so a quick test can never drop a finding.
import { describe, expect, it } from 'vitest';
import { MAX_SCAN_LENGTH, scan } from '../../server/src/core/privacy/scan';
import type { PrivacyKind } from '../../server/src/core/privacy/types';
import { hitsInProse, privacyHits } from './helpers';

/** The matches of a text as kind, text and cue. */
function found(text: string): [PrivacyKind, string, string | null][] {
  return scan(text).map((m) => [m.kind, m.text, m.cue]);
}

describe('the smallest text each detector needs', () => {
  it('a date with one digit, in lower case (no capital lets it through)', () => {
    expect(found('june 4')).toEqual([['calendar-date', 'june 4', null]]);
    expect(found('4th of june')).toEqual([['calendar-date', '4th of june', null]]);
    for (const month of ['january', 'february', 'april', 'july', 'september', 'october', 'november', 'december']) {
      expect(found(`${month} 4`)).toEqual([['calendar-date', `${month} 4`, null]]);
    }
    expect(found('born 1961')).toEqual([['birth-date', '1961', 'born']]);
  });

  it('month names of every length count, and other words do not', () => {
    expect(found('Sept 4')).toEqual([['calendar-date', 'Sept 4', null]]);
    expect(found('september 4')).toEqual([['calendar-date', 'september 4', null]]);
    expect(found('May 4')).toEqual([['calendar-date', 'May 4', null]]);
    expect(found('4 may')).toEqual([]);
    // The day or the year may stand two runs from the month, and no further.
    expect(found('the 4th of March')).toEqual([['calendar-date', '4th of March', null]]);
    expect(found('March 4, 2026')).toEqual([['calendar-date', 'March 4, 2026', null]]);
    expect(found('Mar 2026')).toEqual([['calendar-date', 'Mar 2026', null]]);
    expect(found('March was 4')).toEqual([]);
    expect(found('Septembers 4')).toEqual([]);
  });

  it('a record number of four digits in a run with letters, and of five in a group', () => {
    expect(found('mrn ab1234')).toEqual([['record-number', 'ab1234', 'mrn']]);
    expect(found('mrn 12345')).toEqual([['record-number', '12345', 'mrn']]);
    // Four digits make no identifier, whatever the cue.
    expect(found('mrn 1234')).toEqual([]);
    expect(found('mrn 12 34')).toEqual([]);
    expect(found('mrn ab123')).toEqual([]);
    // Five digits in groups are enough.
    expect(found('mrn 12 345')).toEqual([['record-number', '12 345', 'mrn']]);
    expect(found('id x1234 12')).toEqual([['record-number', 'x1234', 'id']]);
  });

  it('a phone number made of groups of fewer than five digits each', () => {
    expect(found('tel 7946 0958')).toEqual([['phone', '7946 0958', 'tel']]);
    expect(found('(555) 010-1234')).toEqual([['phone', '(555) 010-1234', null]]);
    // Short candidates before it do not stop it.
    expect(found('hr 118 rr 26 tel 7946 0958')).toEqual([['phone', '7946 0958', 'tel']]);
  });

  it('a postal code with two digits, in lower case after a cue and in capitals alone', () => {
    expect(found('postcode a1 1ae')).toEqual([['postal-code', 'a1 1ae', 'postcode']]);
    // Every cue word lets a text in lower case with fewer than four digits through.
    expect(found('post code a1 1ae')).toEqual([['postal-code', 'a1 1ae', 'post code']]);
    expect(found('postal code a1 1ae')).toEqual([['postal-code', 'a1 1ae', 'postal code']]);
    expect(found('zip code a1 1ae')).toEqual([['postal-code', 'a1 1ae', 'zip code']]);
    expect(found('zipcode a1 1ae')).toEqual([['postal-code', 'a1 1ae', 'zipcode']]);
    expect(found('zip a1 1ae')).toEqual([['postal-code', 'a1 1ae', 'zip']]);
    expect(found('addr a1 1ae')).toEqual([['postal-code', 'a1 1ae', 'addr']]);
    expect(found('signpost a1 1ae')).toEqual([]);
    expect(found('A1 1AE')).toEqual([['postal-code', 'A1 1AE', null]]);
    expect(found('AA9A 9AA')).toEqual([['postal-code', 'AA9A 9AA', null]]);
    expect(found('address z1z 9z9')).toEqual([['postal-code', 'z1z 9z9', 'address']]);
    expect(found('zip 00210')).toEqual([['postal-code', '00210', 'zip']]);
    expect(found('Fernleigham, IL 00427')).toEqual([['postal-code', '00427', 'IL']]);
  });

  it('an e-mail address with no capital and no digit', () => {
    expect(found('a@b.co')).toEqual([['email', 'a@b.co', null]]);
  });

  it('a name whose first letter is the only capital of the text, ASCII or not', () => {
    expect(found('wife Mary')).toEqual([['name', 'Mary', 'wife']]);
    expect(found('wife Ólafur')).toEqual([['name', 'Ólafur', 'wife']]);
    expect(found('wife ólafur')).toEqual([]);
    // A capital before the cue is no name after it.
    expect(found('Seen by patel')).toEqual([]);
    expect(found('Mrs June Roe')).toEqual([['name', 'June Roe', 'Mrs']]);
    // The name may start two runs after its cue.
    expect(found('name is Jane Roe')).toEqual([['name', 'Jane Roe', 'name']]);
    expect(found('name was ROE')).toEqual([['name', 'ROE', 'name']]);
    expect(found('Mr J. Roe')).toEqual([['name', 'J. Roe', 'Mr']]);
  });

  it('the longest cue words count, and capitals are no cue but NOK', () => {
    expect(found('forename Jane')).toEqual([['name', 'Jane', 'forename']]);
    expect(found('daughter Anne')).toEqual([['name', 'Anne', 'daughter']]);
    expect(found('NOK Jane Roe')).toEqual([['name', 'Jane Roe', 'NOK']]);
    expect(found('PT Jane Roe')).toEqual([]);
    expect(found('known as Bob')).toEqual([['name', 'Bob', 'known as']]);
  });
});

describe('parts of a line read in place', () => {
  it('finds identifiers in a label, prose, a comment and the free words of an item line, at their columns', () => {
    const note = '@ day 1 08:00  june 4\nnote      wife Mary\nvitals    hr 80   # a@b.co\nvent      mode Smith, peep 10';
    expect(privacyHits(note)).toEqual([
      { code: 'PN503', text: 'june 4' },
      { code: 'PN501', text: 'Mary' },
      { code: 'PN505', text: 'a@b.co' },
    ]);
    expect(hitsInProse('turned and settled, hour 1234')).toEqual([]);
  });

  it('limits each part, not the line, to the longest text scanned', () => {
    // The comment starts far into the line: its e-mail address is within the part's limit.
    const pad = 'x '.repeat(3000);
    const within = `note      ${pad}# ${'y '.repeat(2000)}a@b.co`;
    expect(privacyHits(within)).toEqual([{ code: 'PN505', text: 'a@b.co' }]);
    const beyond = `note      ${'y '.repeat(MAX_SCAN_LENGTH / 2)}a@b.co`;
    expect(privacyHits(beyond)).toEqual([]);
  });
});
