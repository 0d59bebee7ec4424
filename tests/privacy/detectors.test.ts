// Both ways: invented identifiers that must raise exactly their codes (true positives), and
// ordinary clinical phrasing that must raise nothing (true negatives). Every person and number
// here is made up: Jane Roe / John Doe, 555 and Ofcom drama numbers (07700 900xxx, 020 7946 0xxx),
// an NHS number of the range set aside for testing (999 123 4578; the range from memory),
// postal codes of areas and ZIPs that are not allocated (AA9A 9AA, 00427; from memory), example.org addresses.
import { describe, expect, it } from 'vitest';
import { scan } from '../../server/src/core/privacy/scan';
import { hitsInProse, type PrivacyHit } from './helpers';

const NAME = 'PN501';
const BIRTH = 'PN502';
const DATE = 'PN503';
const PHONE = 'PN504';
const EMAIL = 'PN505';
const RECORD = 'PN506';
const POSTAL = 'PN507';

const hit = (code: string, text: string): PrivacyHit => ({ code, text });

/** Phrase → the findings it must raise, in order (code and the exact text covered). */
const TRUE_POSITIVES: readonly (readonly [string, readonly PrivacyHit[]])[] = [
  // names after a cue
  ['name: Jane Roe', [hit(NAME, 'Jane Roe')]],
  ['Mr Smith reviewed at the bedside', [hit(NAME, 'Smith')]],
  ['seen by Dr Patel, plan NIV', [hit(NAME, 'Patel')]],
  ['Dr. O\'Brien aware', [hit(NAME, 'O\'Brien')]],
  ['Mrs J. Roe on the ward', [hit(NAME, 'J. Roe')]],
  ['Miss Jane Roe transferred', [hit(NAME, 'Jane Roe')]],
  ['Prof Smith-Jones consulted', [hit(NAME, 'Smith-Jones')]],
  ['patient John Doe, 64 y', [hit(NAME, 'John Doe')]],
  ['next of kin Jane Roe informed', [hit(NAME, 'Jane Roe')]],
  ['discussed with John Doe (son)', [hit(NAME, 'John Doe')]],
  ['wife Mary at the bedside', [hit(NAME, 'Mary')]],
  // a surname in capitals, a comma and the given name after `patient`, as wristbands print it
  ['Patient: SMITH, John', [hit(NAME, 'SMITH, John')]],
  ['pt ROE, Jane on the ward', [hit(NAME, 'ROE, Jane')]],
  // a nurse named by role, as a carer or a relative is
  ['seen by Nurse Jones', [hit(NAME, 'Jones')]],
  ['handed over to Staff Nurse Okoro at 19:00', [hit(NAME, 'Okoro')]],
  ['known as Johnny on the ward', [hit(NAME, 'Johnny')]],
  // surnames that are also eponyms count after a title or a naming word
  ['Dr Miller reviewed', [hit(NAME, 'Miller')]],
  ['Dr Allen', [hit(NAME, 'Allen')]],
  ['Mrs Murray', [hit(NAME, 'Murray')]],
  ['Mr Wells', [hit(NAME, 'Wells')]],
  ['Dr Riley', [hit(NAME, 'Riley')]],
  ['Mrs Henderson', [hit(NAME, 'Henderson')]],
  ['Mr Fowler', [hit(NAME, 'Fowler')]],
  ['Dr Hudson', [hit(NAME, 'Hudson')]],
  ['Ms Stokes', [hit(NAME, 'Stokes')]],
  ['Dr Miller-Jones', [hit(NAME, 'Miller-Jones')]],
  ['name Jo Allen', [hit(NAME, 'Jo Allen')]],
  // given names that are also months or words, before a surname
  ['Mrs June Roe', [hit(NAME, 'June Roe')]],
  ['Ms April Roe', [hit(NAME, 'April Roe')]],
  ['Mrs May Roe', [hit(NAME, 'May Roe')]],
  ['Dr Will Jonesby', [hit(NAME, 'Will Jonesby')]],
  // names in capitals, and surname-comma-given names, covered whole
  ['Mr SMITHERTON', [hit(NAME, 'SMITHERTON')]],
  ['patient JANE ROE', [hit(NAME, 'JANE ROE')]],
  ['Mrs Jane ROE', [hit(NAME, 'Jane ROE')]],
  ['name: ROE, Jane', [hit(NAME, 'ROE, Jane')]],
  ['Name - Roe, Jane', [hit(NAME, 'Roe, Jane')]],
  // a relative with a colon or a dash still names two words
  ['wife: Jane Roe', [hit(NAME, 'Jane Roe')]],
  // titles in capitals, with names in capitals after them
  ['MR SMITH', [hit(NAME, 'SMITH')]],
  ['MRS ROE AWARE', [hit(NAME, 'ROE')]],
  ['SEEN BY DR PATEL. PLAN NIV', [hit(NAME, 'PATEL')]],
  ['MS JANE ROE', [hit(NAME, 'JANE ROE')]],
  ['PROF ROE-SMITHERTON', [hit(NAME, 'ROE-SMITHERTON')]],
  ['DR J PATEL', [hit(NAME, 'J PATEL')]],
  ['DR MILLER', [hit(NAME, 'MILLER')]],
  ['DR MILDRED ROE', [hit(NAME, 'MILDRED ROE')]],
  ['MRS ROE AND DR PATEL AWARE', [hit(NAME, 'ROE'), hit(NAME, 'PATEL')]],
  // one name word after a relative with a colon or a dash, at the end of its phrase
  ['wife: Mary', [hit(NAME, 'Mary')]],
  ['daughter - Anne', [hit(NAME, 'Anne')]],
  ['NOK: Peter', [hit(NAME, 'Peter')]],
  ['next of kin: Peter', [hit(NAME, 'Peter')]],
  ['son: Peter.', [hit(NAME, 'Peter')]],
  ['partner = Alex', [hit(NAME, 'Alex')]],
  ['daughter - Anne, 07700 900123', [hit(NAME, 'Anne'), hit(PHONE, '07700 900123')]],
  // dates of birth
  ['DOB 12/03/1961', [hit(BIRTH, '12/03/1961')]],
  ['born 1961-03-12', [hit(BIRTH, '1961-03-12')]],
  ['date of birth 4 March 1961', [hit(BIRTH, '4 March 1961')]],
  ['D.O.B. 12/03/61', [hit(BIRTH, '12/03/61')]],
  ['born in 1961, lifelong smoker', [hit(BIRTH, '1961')]],
  ['DOB 12-MAR-1961', [hit(BIRTH, '12-MAR-1961')]],
  ['DOB 12-Mar-61', [hit(BIRTH, '12-Mar-61')]],
  ['DOB 12 Mar 61', [hit(BIRTH, '12 Mar 61')]],
  // calendar dates
  ['admitted 2026-03-04 with pneumonia', [hit(DATE, '2026-03-04')]],
  ['gas repeated on 04/03/2026', [hit(DATE, '04/03/2026')]],
  ['seen in clinic on 4 March 2026', [hit(DATE, '4 March 2026')]],
  ['symptoms since March 4, 2026', [hit(DATE, 'March 4, 2026')]],
  ['extubated on the 3rd of March', [hit(DATE, '3rd of March')]],
  ['last spirometry 12.03.2025', [hit(DATE, '12.03.2025')]],
  ['CT 4-Mar-2026 showed consolidation', [hit(DATE, '4-Mar-2026')]],
  ['home oxygen since Dec 2024', [hit(DATE, 'Dec 2024')]],
  ['sample taken 2026-03-04T08:00', [hit(DATE, '2026-03-04')]],
  ['admitted 04-MAR-2026', [hit(DATE, '04-MAR-2026')]],
  ['04 MAR 2026', [hit(DATE, '04 MAR 2026')]],
  ['4 SEP 2025', [hit(DATE, '4 SEP 2025')]],
  ['admitted 4-Mar-26', [hit(DATE, '4-Mar-26')]],
  // a two-digit year after a day and a month with blanks, covered with them
  ['4 Mar 26', [hit(DATE, '4 Mar 26')]],
  ['seen in clinic 12 March 61, repeat spirometry', [hit(DATE, '12 March 61')]],
  ['admitted on 4 March 99.', [hit(DATE, '4 March 99')]],
  ['DOB 12 MAR 61', [hit(BIRTH, '12 MAR 61')]],
  // a time or a dose after a day and a month is no year
  ['gas on 4 Mar 10:30', [hit(DATE, '4 Mar')]],
  ['4 May 10 mg given', [hit(DATE, '4 May')]],
  ['review Mar. 4th', [hit(DATE, 'Mar. 4th')]],
  // phone numbers
  ['daughter on 07700 900123', [hit(PHONE, '07700 900123')]],
  ['tel +44 20 7946 0958', [hit(PHONE, '+44 20 7946 0958')]],
  ['GP surgery (555) 010-1234', [hit(PHONE, '(555) 010-1234')]],
  ['call back 555-010-1234', [hit(PHONE, '555-010-1234')]],
  ['mobile 555 010 1234', [hit(PHONE, '555 010 1234')]],
  ['ward phone 020 7946 0000', [hit(PHONE, '020 7946 0000')]],
  ['son 07700900123 if worse', [hit(PHONE, '07700900123')]],
  ['ring 07700 900123 in the evening', [hit(PHONE, '07700 900123')]],
  ['+1 555 010 1234 after 18:00', [hit(PHONE, '+1 555 010 1234')]],
  // e-mail addresses
  ['results to jane.roe@example.org', [hit(EMAIL, 'jane.roe@example.org')]],
  ['copy j.doe+icu@hospital.example.org.', [hit(EMAIL, 'j.doe+icu@hospital.example.org')]],
  // record numbers
  ['MRN 1234567', [hit(RECORD, '1234567')]],
  ['NHS 999 123 4578', [hit(RECORD, '999 123 4578')]],
  ['NHS no. 999-123-4578', [hit(RECORD, '999-123-4578')]],
  ['999 123 4578 on the wristband', [hit(RECORD, '999 123 4578')]],
  ['hospital number: AB123456', [hit(RECORD, 'AB123456')]],
  ['ref K7654321 on the request', [hit(RECORD, 'K7654321')]],
  ['SSN 123-45-6789', [hit(RECORD, '123-45-6789')]],
  ['sticker 87654321 on the sample', [hit(RECORD, '87654321')]],
  ['MRN 1234567 per GP letter', [hit(RECORD, '1234567')]],
  ['hospital 1234567X', [hit(RECORD, '1234567X')]],
  // a cue glued to its number by a colon or a full stop, as labels and wristbands print them
  ['MRN:00123456', [hit(RECORD, '00123456')]],
  ['NHS:9991234578, hosp no.48812', [hit(RECORD, '9991234578'), hit(RECORD, '48812')]],
  ['tel:07700 900123', [hit(PHONE, '07700 900123')]],
  // postal codes
  ['lives near AA9A 9AA', [hit(POSTAL, 'AA9A 9AA')]],
  ['moved from Fernleigham, IL 00427', [hit(POSTAL, '00427')]],
  ['lives in Lowmor, MA 00118', [hit(POSTAL, '00118')]],
  ['zip 00210-1234', [hit(POSTAL, '00210-1234')]],
  ['postcode a1 1ae', [hit(POSTAL, 'a1 1ae')]],
  // titles in lower case, as quick notes write them
  ['seen by dr Patel', [hit(NAME, 'Patel')]],
  ['mr Wells reviewed', [hit(NAME, 'Wells')]],
  ['discussed with dr Miller-Jones', [hit(NAME, 'Miller-Jones')]],
  ['Mx Jordan Roe attended', [hit(NAME, 'Jordan Roe')]],
  // several at once
  ['Mr Smith, DOB 12/03/1961, MRN 1234567', [hit(NAME, 'Smith'), hit(BIRTH, '12/03/1961'), hit(RECORD, '1234567')]],
  ['NOK John Doe 07700 900123, john.doe@example.org', [hit(NAME, 'John Doe'), hit(PHONE, '07700 900123'), hit(EMAIL, 'john.doe@example.org')]],
];

/** Ordinary clinical phrasing that must raise no privacy finding. */
const TRUE_NEGATIVES: readonly string[] = [
  // numbers, units and gases
  'PaO2 71 mmHg on FiO2 0.4',
  'gas 7.28/56/71/26 on arrival',
  'bp 120/80, hr 118, rr 26',
  'cannula 4 L/min, then venturi 28 %',
  'PEEP 10 cmH2O, Pplat 28, Ppeak 34',
  'GCS 14, Na 139, K 4.1, Cl 101',
  'P/F 150, S/F 210, ROX 4.2 at 12 h',
  'SpO2 target 88-92 %',
  'Hb 112 g/L, WCC 14.2, CRP 180, platelets 150000',
  'heparin 5000 units, fluids 250 500 1000 mL',
  'fluid balance +1500 mL over 24 h',
  'sats 88 90 92 94 96 over the hour',
  'peep trial 5 8 10 12 14 16',
  'FEV1 1.2 L (45 % predicted), FVC 2.1 L',
  'ECG sinus tachycardia 118 bpm, QTc 450 ms',
  // times, days and counts
  'review at 07:40, again at +2h30',
  'day 2 of admission, 3 times overnight',
  'obs at 0600 1000 1400',
  'nebs x4, x2 doses 12 hrs apart',
  '1/7 history of cough, 3/52 of breathlessness',
  'I:E 1:2, ratio 1:2.5',
  'adrenaline 1:100000 with lidocaine, obs 07:40:12345',
  'age 64 y, weight 71 kg, BMI 26.7',
  // doses, drugs and devices
  'salbutamol 5 mg nebs x4, ipratropium 500 mcg',
  '2.5 mg nebs back to back',
  'Ventolin and Atrovent via Hudson mask',
  'Optiflow 50 L/min, FiO2 0.6, then Airvo',
  'MS contin 10 mg at night',
  // capitalised clinical words, cue words without names
  'Crackles at both bases.',
  'Patient settled overnight',
  'Patient Settled Overnight',
  'Dr review requested',
  'Dr on call aware',
  'Mr review tomorrow morning',
  'Patient Controlled Analgesia running',
  'Patient Group Direction followed',
  'called Outreach at 09:15',
  'Called ICU SpR',
  'discussed with Respiratory Consultant',
  'seen by ICU registrar, for HDU',
  'wife at the bedside, son informed',
  'drug name Ventolin',
  'MR on echo, MS excluded',
  // titles in capitals are also abbreviations (mitral regurgitation or stenosis, multiple
  // sclerosis, magnetic resonance, slow-release morphine, a doctor in shorthand)
  'MR severe, AS moderate',
  'MR SEVERE, AS MODERATE',
  'MS flare',
  'MS FLARE',
  'MR ANGIO',
  'MR ANGIOGRAM BOOKED',
  'MR ON ECHO',
  'MR ECHO, CT CHEST, MRI HEAD',
  'DR REVIEW',
  'DR AWARE',
  'DR ROUND',
  'DR BUSY',
  'DR DELAYED',
  'MR WORSENED',
  'MR QUERY',
  'INFORMED DR RE SATS',
  'MS CONTIN 10 MG',
  'MODERATE MR EXCLUDED',
  'KNOWN MS',
  'MILD MR AR',
  'MR, AS',
  'MR ICU, DR ABG, MS NIV',
  'CHEST DR SWINGING',
  'DR WILL PRESCRIBE',
  'MS MAY RELAPSE',
  'DO NOT MISS DOSES',
  // eponyms and scores
  'Glasgow coma scale 14',
  'Berlin definition met, Murray score 2.5',
  'Winters formula 1.5 x 14 + 8 = 29',
  'Henderson-Hasselbalch check ok',
  'Curb-65 3, NEWS2 7, qSOFA 2',
  'GCS E3 V4 M6 = 13',
  'APACHE II 24, SOFA 9',
  // codes and look-alikes
  'LOINC 2744-1 and 2019-8',
  'ISO 80601-2-12 ventilator',
  'T2 RF, 4HR obs',
  'V1 2MM ST elevation',
  'CO2 retention, H1N1 negative, COVID-19 PCR positive',
  'bed 12, bay 3, ward 7B, ext 4455, bleep 2345',
  // months as words and look-alikes
  'in March the symptoms began',
  'may need NIV',
  'May need NIV overnight',
  'marching band, augmented flow',
  'plan: wean FiO2 to 0.35, ABG in 1 h',
  'born at term, no neonatal problems',
  'x@y not an address, @ day 2',
  'Aug 1.2 g IV tds, then Aug 1 g',
  'May 5 mg be enough?',
  'Head CT 12345 slices',
  'RR 24. May need NIV',
  'GCS 8. May need intubation',
  'RR 30. March to ICU',
  '4 MAR charts signed',
  'MAY NEED NIV',
  // a month in capitals takes a two-digit year after blanks only after a birth cue (`MAR` is
  // also the drug chart)
  '04 MAR 26',
  // quantities after a record cue
  'in this case 25000 units heparin',
  'record 12500 mL out',
  'record 12500mL out',
  'partner Present, wife Updated by phone',
  // services, teams and calls after weak cues
  'referred to Occupational Therapy',
  'seen by Infection Control',
  'seen by Tissue Viability',
  'referred to Pulmonary Rehabilitation',
  'reviewed by Chest Physician',
  'discussed with Transplant Coordinator',
  'called Code Blue',
  'called Rapid Response',
  'seen by Acute Pain Team',
  // family history: a relative with a colon or a dash, or with a disease or a state
  'FHx: Mother - Asthma, Father - Emphysema',
  'Father: COPD, Mother: Lung Cancer',
  'Family history: Brother Asthma',
  'Mother Deceased, Father Alive and well',
  'Daughter Pregnant',
  // social history: a comma ends the cue; prefixes and everyday words are no names
  'Lives with wife, Independent ADLs',
  'lives with husband, Non-smoker',
  'SH: lives with wife, Ex-smoker',
  'Husband: Carer',
  'son Lives abroad',
  'wife Retired teacher',
  'NOK Wife informed',
  // one word after a relative with a colon or a dash: a state, a condition, an occupation, or a
  // phrase that goes on
  'wife: present',
  'son: aware',
  'mother: asthma',
  'Mother: Asthma',
  'wife: Present',
  'son: Aware',
  'lives with wife, Ex-smoker',
  'Wife: Yes',
  'Wife: Accountant',
  'Father: Gout',
  'Mother - Sarcoidosis',
  'Mother: Alzheimers',
  'Son: Autism',
  'Mother: Breast cancer',
  'Mother: Breast Ca',
  'FHx: Father - Hypothyroid',
  'Social history: wife - Housebound',
  // a title that ends a sentence or comes before a verb
  'Escalated to Dr. Awaiting review',
  'Seen by Dr. Impression: pneumonia',
  'Dr Bleeped x2',
  'Dr Advised',
  'Dr Examined chest',
  'Dr Prescribed nebs',
  'Dr Ordered ABG',
  'Dr Verbal Order',
  'Dr Will Review',
  // a title in lower case is also an abbreviation (`mr` mitral regurgitation, `dr` a drain): it
  // counts only with a name right after it, after blanks alone
  'mod mr, Severe AS',
  'mod mr Severe AS',
  'mr Trace, tr Mild',
  'chest dr Removed',
  'known ms, Relapsing',
  // `Mx:` heads a management plan
  'Mx: Antibiotics and fluids',
  'Imp: CAP, Mx: Augmentin IV',
  // phrases after `patient` and `pt`
  'Patient Own Drugs checked',
  'Patient Held Record',
  'Patient Liaison Officer',
  'Pt Coughing Green Sputum',
  // abbreviations in capitals are no names
  'Mr ICU',
  'Patient NIV HFNC',
  'NOK AWARE',
  'name Berlin, score Murray',
  // after `patient`, one word, a comma and another are no name unless the first is a surname in capitals
  'patient: Anxious, Tearful',
  'Patient: NIV, Settled overnight',
  // a nurse's role, no name
  'Nurse Practitioner review, Nurse Specialist aware',
  'Nurse Led weaning, Nurse Escort for transfer',
  'nurse In charge informed, Staff Nurse Aware',
];

describe('privacy detectors: true positives', () => {
  it(`has a table of at least 25 true positives (${TRUE_POSITIVES.length})`, () => {
    expect(TRUE_POSITIVES.length).toBeGreaterThanOrEqual(25);
  });
  for (const [phrase, expected] of TRUE_POSITIVES) {
    it(`flags: ${phrase}`, () => {
      expect(hitsInProse(phrase)).toEqual(expected);
    });
  }
});

describe('privacy detectors: true negatives', () => {
  it(`has a table of at least 40 true negatives (${TRUE_NEGATIVES.length})`, () => {
    expect(TRUE_NEGATIVES.length).toBeGreaterThanOrEqual(40);
  });
  for (const phrase of TRUE_NEGATIVES) {
    it(`stays silent: ${phrase}`, () => {
      expect(hitsInProse(phrase)).toEqual([]);
      expect(scan(phrase)).toEqual([]);
    });
  }
});

describe('scan', () => {
  it('returns kinds, spans in the scanned text and the cue', () => {
    const text = 'Dr Patel, DOB 12/03/1961';
    expect(scan(text)).toEqual([
      { kind: 'name', span: { start: 3, end: 8 }, text: 'Patel', cue: 'Dr' },
      { kind: 'birth-date', span: { start: 14, end: 24 }, text: '12/03/1961', cue: 'DOB' },
    ]);
  });

  it('keeps one match where detectors overlap (the longer, then the more specific)', () => {
    // `20260304` is a compact date and a long run of digits: the date wins.
    expect(scan('sample 20260304').map((m) => m.kind)).toEqual(['calendar-date']);
    // `DOB 1961-03-12`: a birth date, not a calendar date.
    expect(scan('DOB 1961-03-12').map((m) => m.kind)).toEqual(['birth-date']);
  });

  it('answers quickly on long adversarial lines (a smoke test of linear scanning)', () => {
    const n = 5000;
    const inputs = [
      '1 '.repeat(n), '1-'.repeat(n), '1.'.repeat(n), '(1'.repeat(n), '+1 '.repeat(n), 'a@'.repeat(n), '@a.'.repeat(n),
      'Dr '.repeat(n), 'Mr Ab '.repeat(n), 'name: '.repeat(n), 'MRN 1 '.repeat(n), '12/'.repeat(n), '4 March '.repeat(n),
      'AA9A '.repeat(n), 'DOB '.repeat(n), 'a'.repeat(n * 2), '9'.repeat(n * 2), 'x.'.repeat(n) + '@' + 'y.'.repeat(n),
    ];
    for (const input of inputs) {
      const t0 = performance.now();
      scan(input);
      // Generous: a 10 000-character line scans in tens of milliseconds; backtracking would take minutes.
      expect(performance.now() - t0, JSON.stringify(input.slice(0, 12))).toBeLessThan(2000);
    }
  });
});
