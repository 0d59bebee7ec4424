/**
 * Person names after a cue: a title (`Mr`, `Mrs`, `Ms`, `Miss`, `Mx`, `Dr`, `Prof`), a naming
 * word (`name`, `named`, `aka`, `known as`), a relative (`wife`, `son`, `next of kin` …) or a
 * weaker cue (`patient`, `pt`, `called`, `seen by`, `discussed with` …), followed by
 * capitalised words (`Jane Roe`, `O'Brien`, `Smith-Jones`, `J. Roe`).
 *
 * A name word is capitalised with lower-case letters after (`Patel`, not `PEEP` or `review`)
 * and is not one of the common capitalised words of clinical prose (`Review`, `Team`, `Settled`,
 * `Glasgow`, `Outreach` …). After a weak cue two name words are needed (`patient Jane Roe`),
 * so `Patient Settled overnight` and `Patient Controlled Analgesia` stay silent.
 */
import { FIELDS } from '../fields/registry';
import { SECTIONS } from '../fields/sections';
import { UNITS } from '../fields/units';
import { isBlankGap, isLowerChar, isUpperChar, runsOf, type Run } from './text';
import { match, type PrivacyMatch } from './types';

type Strength = 'strong' | 'weak';

/** Titles count only in these spellings (so `MR` mitral regurgitation and `MS` are not titles). */
const TITLES = new Set(['Mr', 'Mrs', 'Ms', 'Miss', 'Mx', 'Dr', 'Prof', 'mr', 'mrs', 'dr', 'prof']);
const STRONG_WORDS = new Set(['name', 'named', 'aka', 'surname', 'forename', 'wife', 'husband', 'partner', 'son', 'daughter', 'mother', 'father', 'sister', 'brother', 'nok', 'carer']);
const WEAK_WORDS = new Set(['patient', 'pt', 'called']);
/** `by`, `with`, `to` are cues only after these words (`seen by`, `discussed with`, `spoke to`). */
const VERBS_BEFORE_PREPOSITION = new Set(['seen', 'reviewed', 'discussed', 'examined', 'assessed', 'spoke', 'spoken', 'talked', 'referred', 'handed', 'accompanied', 'visited']);
/** `name` is no cue after these (`drug name Ventolin`, `brand name`). */
const NOT_PERSON_NAME = new Set(['drug', 'brand', 'trade', 'generic', 'device', 'product', 'file', 'user', 'disease', 'condition', 'test', 'code', 'section', 'field', 'unit', 'mode', 'key', 'ward', 'hospital', 'company']);

/**
 * Capitalised words that follow cues in ordinary clinical prose and are not names: sentence
 * words, clinical states, teams and places of care, eponyms used clinically. Lower case.
 */
const NOT_NAMES = new Set([
  // sentence and function words
  'the', 'a', 'an', 'and', 'or', 'but', 'is', 'was', 'has', 'had', 'have', 'with', 'without', 'on', 'in', 'at', 'to', 'for', 'of',
  'not', 'no', 'now', 'then', 'today', 'tonight', 'yesterday', 'tomorrow', 'overnight', 'also', 'again', 'still', 'this', 'that',
  'he', 'she', 'they', 'his', 'her', 'their', 'it', 'we', 'i', 'please', 'plan', 'see', 'nil', 'none', 'all', 'both', 'same',
  'here', 'there', 'who', 'which', 'when', 'will', 'would', 'should', 'can', 'could', 'may', 'might', 'must', 'after', 'before',
  'during', 'from', 'into', 'over', 'under', 'via', 'per', 'as', 'by', 'if', 'so', 'very', 'well', 'more', 'less', 'much',
  // clinical states and actions
  'settled', 'stable', 'unstable', 'unwell', 'well', 'improving', 'improved', 'worse', 'worsening', 'deteriorating', 'better',
  'remains', 'remained', 'reviewed', 'review', 'seen', 'aware', 'informed', 'notified', 'called', 'transferred', 'admitted',
  'discharged', 'intubated', 'extubated', 'sedated', 'requires', 'required', 'needs', 'needed', 'declined', 'refused',
  'tolerating', 'tolerated', 'denies', 'reports', 'reported', 'states', 'complains', 'comfortable', 'agitated', 'drowsy',
  'alert', 'confused', 'febrile', 'afebrile', 'hypoxic', 'hypoxaemic', 'hypoxemic', 'tachypnoeic', 'tachypneic', 'breathless',
  'awake', 'asleep', 'orientated', 'oriented', 'responsive', 'unresponsive', 'weaning', 'weaned', 'ventilated', 'paralysed',
  'proned', 'supine', 'prone', 'sitting', 'mobilising', 'mobile', 'eating', 'drinking', 'nbm', 'dnr', 'dnacpr', 'for', 'not',
  'controlled', 'group', 'direction', 'safety', 'outcome', 'outcomes', 'experience', 'reported', 'centred', 'centered',
  'transport', 'transfer', 'advice', 'information', 'leaflet', 'consent', 'request', 'requested', 'plan', 'handover',
  'present', 'absent', 'visiting', 'visited', 'updated', 'phoned', 'rang', 'contacted', 'happy', 'concerned', 'worried', 'upset',
  'agrees', 'agreed', 'understands', 'understood', 'wishes', 'prefers', 'wants', 'asked', 'asks', 'aware', 'attended', 'arrived',
  'left', 'gone', 'says', 'said', 'feels', 'felt', 'thinks', 'here', 'away', 'unavailable', 'available', 'unreachable',
  // teams, roles and places of care
  'team', 'teams', 'outreach', 'resus', 'resuscitation', 'critical', 'intensive', 'care', 'medical', 'medicine', 'surgical',
  'surgery', 'nursing', 'nurse', 'nurses', 'doctor', 'doctors', 'physio', 'physiotherapy', 'physiotherapist', 'pharmacy',
  'pharmacist', 'radiology', 'radiologist', 'microbiology', 'virology', 'anaesthetics', 'anaesthesia', 'anesthesia',
  'anaesthetist', 'anesthesiologist', 'theatre', 'theatres', 'ward', 'wards', 'bed', 'bay', 'room', 'side', 'unit', 'department',
  'emergency', 'ambulance', 'paramedic', 'paramedics', 'crew', 'family', 'relatives', 'consultant', 'registrar', 'reg',
  'fellow', 'resident', 'intern', 'attending', 'senior', 'junior', 'duty', 'night', 'day', 'charge', 'on', 'call', 'oncall',
  'respiratory', 'cardiology', 'cardiac', 'renal', 'orthopaedic', 'orthopedic', 'ortho', 'paediatric', 'pediatric', 'paeds',
  'peds', 'neonatal', 'obstetric', 'obstetrics', 'haematology', 'hematology', 'oncology', 'palliative', 'acute', 'general',
  'infectious', 'diseases', 'gastro', 'gastroenterology', 'neurology', 'neurosurgery', 'vascular', 'cardiothoracic',
  'thoracic', 'trauma', 'stroke', 'sepsis', 'security', 'switchboard', 'porter', 'porters', 'bleep', 'pager', 'gp',
  'home', 'hospital', 'hospice', 'clinic', 'community', 'practice', 'surgeon', 'specialist', 'therapist', 'dietitian',
  'dietician', 'staff', 'student', 'midwife', 'chaplain', 'interpreter', 'social', 'services', 'worker', 'police', 'coroner',
  'patient', 'patients', 'pt', 'name', 'unknown', 'anonymous', 'redacted', 'withheld', 'initials',
  // eponyms and proper nouns used clinically
  'glasgow', 'berlin', 'winters', 'venturi', 'hudson', 'guedel', 'yankauer', 'foley', 'swan', 'ganz', 'fick', 'henderson',
  'hasselbalch', 'kussmaul', 'cheyne', 'stokes', 'parkinson', 'alzheimer', 'crohn', 'addison', 'cushing', 'hodgkin', 'wells',
  'geneva', 'murray', 'denver', 'boston', 'richmond', 'ramsay', 'apgar', 'allen', 'valsalva', 'trendelenburg', 'fowler',
  'heimlich', 'bohr', 'haldane', 'starling', 'laplace', 'poiseuille', 'fenn', 'rahn', 'riley', 'hufner', 'hüfner', 'mallampati',
  'cormack', 'lehane', 'macintosh', 'miller', 'magill', 'seldinger', 'doppler', 'holter', 'bipap', 'optiflow', 'airvo',
  'ventolin', 'atrovent', 'salbutamol', 'ipratropium', 'prednisolone', 'hydrocortisone', 'heliox', 'entonox',
  // days and months (dates are found by their own detector)
  'monday', 'tuesday', 'wednesday', 'thursday', 'friday', 'saturday', 'sunday',
  'january', 'february', 'march', 'april', 'june', 'july', 'august', 'september', 'october', 'november', 'december',
]);

/**
 * Every word of the registries (section names, keys, field labels and LOINC displays, word
 * values, units), lower case: a word Pneumark itself uses is not a name (`Tidal`, `Plasma`).
 */
const REGISTRY_WORDS: ReadonlySet<string> = new Set(
  [
    ...SECTIONS.flatMap((sec) => [sec.id, ...sec.aliases]),
    ...FIELDS.flatMap((f) => [...f.aliases, f.label, f.short ?? '', f.loinc?.display ?? '', ...Object.keys(f.words ?? {}), ...Object.values(f.words ?? {})]),
    ...UNITS.flatMap((u) => [u.id, ...u.aliases]),
  ].flatMap((phrase) => runsOf(phrase).filter((r) => r.kind === 'letters').map((r) => r.text.toLowerCase())),
);

function isNotName(word: string): boolean {
  const lower = word.toLowerCase();
  return NOT_NAMES.has(lower) || REGISTRY_WORDS.has(lower);
}

interface Cue {
  readonly strength: Strength;
  /** The cue as written, with the word before it for two-word cues (`known as`, `seen by`). */
  readonly label: string;
}

function cueAt(text: string, runs: readonly Run[], i: number): Cue | null {
  const run = runs[i]!;
  if (run.kind !== 'letters') return null;
  if (TITLES.has(run.text)) return { strength: 'strong', label: run.text };
  const lower = run.text.toLowerCase();
  // All-capital words are abbreviations, not cues (`PT` physiotherapy), except `NOK`.
  if (run.text.length > 1 && run.text === run.text.toUpperCase() && lower !== 'nok') return null;
  const prev = runs[i - 1];
  const prevWord = prev && isBlankGap(text.slice(prev.end, run.start)) ? prev.text.toLowerCase() : null;
  const withPrev = prev ? text.slice(prev.start, run.end) : run.text;
  if (lower === 'as' && prevWord === 'known') return { strength: 'strong', label: withPrev };
  if (lower === 'kin' && prevWord === 'of') {
    const first = runs[i - 2];
    return { strength: 'strong', label: first && first.text.toLowerCase() === 'next' ? text.slice(first.start, run.end) : withPrev };
  }
  if (lower === 'name' && prevWord !== null && NOT_PERSON_NAME.has(prevWord)) return null;
  if (STRONG_WORDS.has(lower)) return { strength: 'strong', label: run.text };
  if (lower === 'by' || lower === 'with' || lower === 'to') return prevWord !== null && VERBS_BEFORE_PREPOSITION.has(prevWord) ? { strength: 'weak', label: withPrev } : null;
  if (WEAK_WORDS.has(lower)) return { strength: 'weak', label: run.text };
  return null;
}

/**
 * Between a cue and the name: blanks with at most one mark (`name: Jane Roe`, `patient, Jane Roe`).
 * A full stop only after a title (`Dr. Patel`); after any other cue it ends the sentence.
 */
function isCueGap(gap: string, title: boolean): boolean {
  if (gap.length === 0 || gap.length > 6) return false;
  let marks = 0;
  for (let k = 0; k < gap.length; k++) {
    const ch = gap.charAt(k);
    if (isBlankGap(ch)) continue;
    if ((ch === '.' && title) || ch === ':' || ch === ',' || ch === '-' || ch === '=' || ch === '–') marks++;
    else return false;
  }
  return marks <= 1;
}

/** A capitalised word: `Patel`, `McDonald`, `Zoë`; not `PEEP`, `review` or `X`. */
function isCapitalised(word: string): boolean {
  if (word.length < 2 || !isUpperChar(word.charAt(0)) || !isLowerChar(word.charAt(1))) return false;
  for (let k = 1; k < word.length; k++) if (!isLowerChar(word.charAt(k)) && !isUpperChar(word.charAt(k))) return false;
  return true;
}

interface NameWord {
  readonly start: number;
  readonly end: number;
  /** Index of the run after this word. */
  readonly next: number;
  readonly initial: boolean;
}

/**
 * Reads one name word at run `i`: a capitalised word, possibly joined to more by an apostrophe
 * or a hyphen (`O'Brien`, `Smith-Jones`), or an initial (`J` or `J.`).
 */
function nameWordAt(text: string, runs: readonly Run[], i: number): NameWord | null {
  const run = runs[i];
  if (!run || run.kind !== 'letters') return null;
  let j = i;
  let end = run.end;
  const parts = [run.text];
  for (;;) {
    const next = runs[j + 1];
    if (!next || next.kind !== 'letters' || !isCapitalised(next.text)) break;
    const joint = text.slice(end, next.start);
    if (joint !== "'" && joint !== '\u2019' && joint !== '-') break;
    parts.push(next.text);
    end = next.end;
    j++;
  }
  const head = parts[0]!;
  if (parts.length === 1 && head.length === 1) {
    if (!isUpperChar(head)) return null;
    return { start: run.start, end: text.charAt(end) === '.' ? end + 1 : end, next: j + 1, initial: true };
  }
  const headOk = isCapitalised(head) || (parts.length > 1 && head.length === 1 && isUpperChar(head));
  // A title starts a name of its own (`seen by Dr Patel`: the name is `Patel`, after `Dr`).
  if (!headOk || TITLES.has(head) || isNotName(head) || isNotName(text.slice(run.start, end))) return null;
  return { start: run.start, end, next: j + 1, initial: false };
}

export function findNames(text: string): PrivacyMatch[] {
  const runs = runsOf(text);
  const out: PrivacyMatch[] = [];
  for (let i = 0; i < runs.length; i++) {
    const found = cueAt(text, runs, i);
    if (!found) continue;
    const strength = found.strength;
    const cue = runs[i]!;
    let j = i + 1;
    const first = runs[j];
    if (!first || !isCueGap(text.slice(cue.end, first.start), TITLES.has(cue.text))) continue;
    // `name is Jane Roe`, `name was Jane Roe`.
    if ((first.text === 'is' || first.text === 'was') && runs[j + 1] && isBlankGap(text.slice(first.end, runs[j + 1]!.start))) j++;
    const words: NameWord[] = [];
    let prevEnd = -1;
    while (words.length < 4) {
      const run = runs[j];
      if (!run) break;
      if (words.length > 0) {
        const gap = text.slice(prevEnd, run.start);
        if (!(isBlankGap(gap) || (words[words.length - 1]!.initial && gap.length === 0))) break;
      }
      const w = nameWordAt(text, runs, j);
      if (!w) break;
      words.push(w);
      prevEnd = w.end;
      j = w.next;
    }
    // Drop trailing initials: an initial alone is no name (`Dr A`).
    while (words.length > 0 && words[words.length - 1]!.initial) words.pop();
    const full = words.filter((w) => !w.initial).length;
    if (full === 0 || (strength === 'weak' && words.length < 2)) continue;
    out.push(match('name', text, words[0]!.start, words[words.length - 1]!.end, found.label));
    i = j - 1;
  }
  return out;
}
