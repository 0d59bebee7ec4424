/**
 * Person names after a cue: a title (`Mr`, `Mrs`, `Ms`, `Miss`, `Mx`, `Dr`, `Prof`, capitalised
 * only), a naming word (`name`, `named`, `aka`, `known as`), a relative (`wife`, `son`, `next of
 * kin` …) or a weaker cue (`patient`, `pt`, `called`, `seen by`, `discussed with` …), followed by
 * capitalised words (`Jane Roe`, `O'Brien`, `Smith-Jones`, `J. Roe`) or words in capitals that
 * are no known abbreviation (`ROE`, not `ICU`).
 *
 * A name word is not one of the common capitalised words of clinical prose (`Review`, `Team`,
 * `Settled`, `Therapy`, `Asthma`, `Advised` …); eponyms (`Glasgow`, `Murray`, `Miller`) count only
 * after a title (`Dr Miller`) or a given name after a naming word (`name Jo Allen`). After a weak cue, and after a relative followed by `:` or `-`
 * (`Mother - Asthma`), two name words are needed (`patient Jane Roe`), so `Patient Settled
 * overnight` and `Patient Controlled Analgesia` stay silent; a comma after a relative ends the cue.
 * One name word after a relative with `:` or `-` counts when it ends the phrase, is no disease
 * and no history heading came before it (`wife: Mary`, `daughter - Anne, 07700 900123`).
 * Titles in capitals (`MR`, `MRS`, `MS`, `DR`, `PROF`) are also abbreviations (mitral
 * regurgitation, multiple sclerosis, doctor in shorthand): they count only with name words in
 * capitals right after them (`MR SMITH`, `MS JANE ROE`, not `MR severe`, `MS FLARE`, `MR ANGIO`).
 */
import { FIELDS, loincCodesOf } from '../fields/registry';
import { SECTIONS } from '../fields/sections';
import { UNITS } from '../fields/units';
import { isAsciiLowerAt, isBlankGap, isLetterChar, isLowerChar, isUpperChar, mayBeUpperAt, runsOf, type Run } from './text';
import { match, type PrivacyMatch } from './types';

type Strength = 'strong' | 'weak';

/**
 * Titles count capitalised, in these spellings. In lower case (`mod mr`, `chest dr` a drain) and
 * in capitals (`MR` mitral regurgitation, `MS` multiple sclerosis) they are also abbreviations:
 * see `BARE_TITLES` and `CAPITAL_TITLES`.
 */
const TITLES = new Set(['Mr', 'Mrs', 'Ms', 'Miss', 'Mx', 'Dr', 'Prof']);
/** Naming words: after these a given name may come before an eponym surname (`name Jo Allen`). */
const NAMING_WORDS = new Set(['name', 'named', 'aka', 'surname', 'forename']);
/**
 * Relatives: a cue when a name follows directly (`wife Mary`). After `:` or `-` they head a
 * family or social history (`Mother - Asthma`) and need two name words, like a weak cue, or one
 * that passes `isLoneNameAfterRelative` (`wife: Mary`); a comma after them ends the cue (`lives
 * with wife, Independent`).
 */
const RELATIVES = new Set(['wife', 'husband', 'partner', 'son', 'daughter', 'mother', 'father', 'sister', 'brother']);
/** Roles that name the person who holds them as a relative does (`carer Jo`, `Nurse Jones`). */
const OTHER_STRONG_WORDS = new Set(['nok', 'carer', 'nurse']);
const WEAK_WORDS = new Set(['patient', 'pt', 'called']);
/** The weak cues after which a surname in capitals, a comma and a given name are a name (`Patient: SMITH, John`). */
const PATIENT_WORDS = new Set(['patient', 'pt']);
/** `by`, `with`, `to` are cues only after these words (`seen by`, `discussed with`, `spoke to`). */
const VERBS_BEFORE_PREPOSITION = new Set(['seen', 'reviewed', 'discussed', 'examined', 'assessed', 'spoke', 'spoken', 'talked', 'referred', 'handed', 'accompanied', 'visited']);
/** `name` is no cue after these (`drug name Ventolin`, `brand name`). */
const NOT_PERSON_NAME = new Set(['drug', 'brand', 'trade', 'generic', 'device', 'product', 'file', 'user', 'disease', 'condition', 'test', 'code', 'section', 'field', 'unit', 'mode', 'key', 'ward', 'hospital', 'company']);

/**
 * Capitalised words that follow cues in ordinary clinical prose and are not names: sentence
 * words, clinical states, teams and places of care, eponyms used clinically. Lower case.
 */
const NOT_NAMES = new Set([
  // grades and qualifiers of findings (`mod mr Severe`, `mr Trace`: mitral regurgitation)
  'severe', 'moderate', 'mild', 'trace', 'trivial', 'significant', 'functional', 'mixed', 'minimal', 'marked', 'gross', 'massive',
  // sentence and function words
  'the', 'a', 'an', 'and', 'or', 'but', 'is', 'was', 'has', 'had', 'have', 'with', 'without', 'on', 'in', 'at', 'to', 'for', 'of',
  'not', 'no', 'now', 'then', 'today', 'tonight', 'yesterday', 'tomorrow', 'overnight', 'also', 'again', 'still', 'this', 'that',
  'he', 'she', 'they', 'his', 'her', 'their', 'it', 'we', 'i', 'please', 'plan', 'see', 'nil', 'none', 'all', 'both', 'same',
  'here', 'there', 'who', 'which', 'when', 'will', 'would', 'should', 'can', 'could', 'may', 'might', 'must', 'after', 'before', 'yes',
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
  'led', 'escort', 'escorted',
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
  // drugs and devices
  'bipap', 'optiflow', 'airvo', 'ventolin', 'atrovent', 'salbutamol', 'ipratropium', 'prednisolone', 'hydrocortisone', 'heliox',
  'entonox',
  // services, roles and calls (`referred to Occupational Therapy`, `called Code Blue`)
  'therapy', 'therapies', 'control', 'viability', 'rehabilitation', 'rehab', 'physician', 'physicians', 'coordinator',
  'co', 'ordinator', 'service', 'clinic', 'clinics', 'specialist', 'specialists', 'mdt', 'occupational', 'speech', 'language',
  'infection', 'prevention', 'tissue', 'pulmonary', 'chest', 'transplant', 'code', 'blue', 'red', 'response', 'rapid',
  'liaison', 'officer', 'advocate', 'manager', 'matron', 'sister', 'coordinating', 'practitioner', 'advanced', 'clinical',
  'lead', 'director', 'technician', 'physiologist', 'sho', 'spr', 'fy', 'ct', 'st', 'hca', 'anp', 'acp', 'rn', 'ccu', 'sdu',
  'carer', 'carers', 'assistant', 'support', 'dietetics', 'sleep', 'lab', 'laboratory', 'bronchoscopy', 'endoscopy', 'xray',
  'x', 'ray', 'imaging', 'ct', 'mri', 'ultrasound', 'echo', 'ecg', 'cardiologist', 'intensivist', 'hospitalist', 'oncologist',
  'own', 'drugs', 'drug', 'medication', 'medications', 'meds', 'held', 'record', 'records', 'notes', 'chart', 'charts',
  'coughing', 'green', 'yellow', 'sputum', 'productive', 'cough', 'wheezy', 'wheezing',
  // diseases and states in family and social histories (`Mother - Asthma`, `son Lives abroad`)
  'asthma', 'asthmatic', 'emphysema', 'copd', 'cancer', 'lung', 'lungs', 'carcinoma', 'tumour', 'tumor', 'leukaemia', 'leukemia',
  'lymphoma', 'diabetes', 'diabetic', 'hypertension', 'dementia', 'bronchiectasis', 'fibrosis', 'cystic', 'tuberculosis',
  'tb', 'heart', 'disease', 'failure', 'attack', 'mi', 'ihd', 'cva', 'clots', 'clot', 'dvt', 'pe', 'epilepsy', 'arthritis',
  'deceased', 'died', 'dead', 'alive', 'living', 'pregnant', 'healthy', 'fit', 'frail', 'elderly', 'nil', 'nkda', 'unknown',
  'gout', 'eczema', 'lupus', 'migraine', 'angina', 'depression', 'anxiety', 'obesity', 'sarcoid', 'coeliac', 'thyroid',
  'aneurysm', 'breast', 'bowel', 'prostate', 'adopted', 'housebound', 'bedbound',
  'lives', 'lived', 'live', 'independent', 'dependent', 'retired', 'works', 'worked', 'working', 'employed', 'unemployed',
  'smoker', 'smokers', 'smokes', 'smoked', 'smoking', 'non', 'ex', 'current', 'former', 'never', 'drinks', 'alcohol',
  'abroad', 'locally', 'nearby', 'alone', 'together', 'teacher', 'builder', 'farmer', 'miner', 'driver', 'cleaner',
  'engineer', 'accountant', 'plumber', 'electrician', 'secretary', 'solicitor', 'mechanic', 'labourer',
  'housewife', 'student', 'supportive', 'involved', 'visits', 'cares', 'helps', 'manages', 'independently', 'adls', 'adl',
  'wife', 'husband', 'partner', 'son', 'daughter', 'mother', 'father', 'brother', 'sibling', 'siblings', 'friend', 'neighbour',
  'neighbor', 'niece', 'nephew', 'aunt', 'uncle', 'cousin', 'grandson', 'granddaughter', 'grandmother', 'grandfather', 'nok',
  'conservative', 'continue', 'continued', 'ceiling', 'escalate', 'escalation', 'likely', 'possible', 'probable',
  'divorced', 'married', 'widowed', 'widower', 'separated', 'single', 'estranged', 'bereaved', 'also',
  // verbs after a title or a full stop (`Dr Advised`, `Escalated to Dr. Awaiting review`)
  'awaiting', 'waiting', 'impression', 'bleeped', 'paged', 'advised', 'advises', 'advising', 'examined', 'examining',
  'prescribed', 'prescribing', 'ordered', 'orders', 'order', 'verbal', 'telephone', 'phone', 'wrote', 'written', 'documented',
  'explained', 'discussed', 'spoke', 'spoken', 'noted', 'note', 'assessed', 'assessing', 'reviewing', 'plans', 'planned',
  'started', 'stopped', 'increased', 'decreased', 'changed', 'adjusted', 'escalated', 'escalating', 'consulted', 'confirmed',
  'recommended', 'recommends', 'suggested', 'suggests', 'kindly', 'inserted', 'removed', 'sited', 'performed', 'arranged',
  'booked', 'prescription', 'instructions', 'instructed', 'happy', 'content', 'satisfied', 'notified', 'opinion', 'input',
  'saw', 'came', 'attends', 'attending', 'covering', 'bleep', 'rota', 'handover', 'cannulated', 'aspirated', 'drained',
  'listened', 'auscultated', 'agreed', 'declined', 'accepted', 'accepts', 'refused', 'unable', 'able', 'gave', 'given',
  // days and months (dates are found by their own detector)
  'monday', 'tuesday', 'wednesday', 'thursday', 'friday', 'saturday', 'sunday',
  'january', 'february', 'march', 'april', 'june', 'july', 'august', 'september', 'october', 'november', 'december',
]);

/**
 * Eponyms and place names used clinically (`Glasgow`, `Hudson mask`, `Murray score`): no name
 * after a relative or a weak cue, but common surnames too, so after a title, or after a given
 * name that follows a naming word, they count (`Dr Miller`, `name Jo Allen`). Lower case.
 */
const EPONYMS = new Set([
  'glasgow', 'berlin', 'winters', 'hudson', 'guedel', 'yankauer', 'foley', 'swan', 'ganz', 'fick', 'henderson',
  'hasselbalch', 'kussmaul', 'cheyne', 'stokes', 'parkinson', 'alzheimer', 'crohn', 'addison', 'cushing', 'hodgkin', 'wells',
  'geneva', 'murray', 'denver', 'boston', 'richmond', 'ramsay', 'apgar', 'allen', 'valsalva', 'trendelenburg', 'fowler',
  'heimlich', 'bohr', 'haldane', 'starling', 'laplace', 'poiseuille', 'fenn', 'rahn', 'riley', 'hufner', 'hüfner', 'mallampati',
  'cormack', 'lehane', 'macintosh', 'miller', 'magill', 'seldinger', 'doppler', 'holter',
]);

/**
 * Words of the not-names that are also given names: after a title or a naming word, followed by
 * a name word, they start a name (`Mrs June Roe`, `Dr Will Jonesby`). Lower case.
 */
const GIVEN_NAMES = new Set(['april', 'may', 'june', 'july', 'august', 'will', 'sunday', 'grace', 'hope', 'faith', 'joy']);

/**
 * Abbreviations written in capitals that are never surnames, though they hold a vowel
 * (`Dr ABG`, `patient NIV ICU`). Capitalised words of two letters or more outside this list
 * count as name words after a cue (`Mr SMITHERTON`, `patient JANE ROE`). Lower case.
 */
const ABBREVIATIONS = new Set([
  'icu', 'itu', 'hdu', 'ed', 'ae', 'aau', 'amu', 'mau', 'sau', 'or', 'pacu', 'ccot', 'mdt', 'nbm', 'dnr', 'dnar', 'dnacpr',
  'abg', 'vbg', 'cbg', 'niv', 'hfnc', 'cpap', 'bipap', 'peep', 'ecmo', 'copd', 'ards', 'aki', 'ckd', 'uti', 'urti', 'lrti',
  'cap', 'hap', 'vap', 'pe', 'dvt', 'acs', 'af', 'mi', 'ihd', 'ccf', 'lvf', 'hf', 'osa', 'ohs', 'ild', 'ipf', 'cf', 'tb',
  'hiv', 'covid', 'sars', 'cov', 'rsv', 'mrsa', 'gcs', 'news', 'avpu', 'sofa', 'apache', 'curb', 'rox', 'obs', 'ews', 'pews',
  'ecg', 'echo', 'cxr', 'ctpa', 'mri', 'us', 'pocus', 'fbc', 'ue', 'lft', 'lfts', 'crp', 'pct', 'inr', 'aptt', 'bnp',
  'iv', 'im', 'sc',  'po', 'pr', 'ng', 'ngt', 'peg', 'tpn', 'ivi', 'pca', 'ett', 'lma', 'ippv', 'simv', 'prvc', 'aprv',
  'sob', 'soboe', 'doe', 'pnd', 'loc', 'aaox', 'oe', 'ix', 'dx', 'ddx', 'hx', 'pmh', 'shx', 'fhx', 'dh', 'sh', 'fh', 'hpc',
  'pc', 'ros', 'rv', 'lv', 'ra', 'la', 'hr', 'rr', 'bp', 'sat', 'sats', 'spo', 'fio', 'pao', 'paco', 'ok', 'nad', 'nok',
  'gp', 'sho', 'spr', 'fy', 'reg', 'hca', 'anp', 'acp', 'rn', 'ot', 'slt', 'salt', 'pt', 'physio', 'tds', 'bd', 'od', 'qds',
  'prn', 'stat', 'nebs', 'neb', 'ics', 'laba', 'lama', 'saba', 'mdi', 'dpi', 'ltot', 'ambo', 'ivabx', 'abx', 'ppi', 'vte',
  'lmwh', 'ace', 'arb', 'nsaid', 'nsaids', 'ssri', 'ebv', 'cmv', 'ana', 'anca', 'ige', 'feno', 'pefr', 'pef', 'fev', 'fvc',
  'tlco', 'kco', 'rv', 'tlc', 'vo', 'ae', 'ecopd', 'aecopd', 'ira', 'yes', 'no', 'nil', 'na', 'nkda', 'uk', 'usa', 'nhs', 'id',
  'mrn', 'dob', 'age', 'male', 'female', 'aaa', 'oob', 'ooh', 'eol', 'ttl', 'eta', 'etoh', 'ivdu', 'adls', 'adl',
  'loinc', 'ucum', 'fhir', 'snomed', 'icd', 'nice', 'bts', 'ers', 'ats', 'gold', 'who', 'iso', 'sarif', 'csv', 'json', 'asap',
]);

/**
 * Every word of the registries (section names, keys, field labels and LOINC displays, word
 * values, units), lower case: a word Pneumark itself uses is not a name (`Tidal`, `Plasma`).
 */
const REGISTRY_WORDS: ReadonlySet<string> = new Set(
  [
    ...SECTIONS.flatMap((sec) => [sec.id, ...sec.aliases]),
    ...FIELDS.flatMap((f) => [...f.aliases, f.label, f.short ?? '', ...loincCodesOf(f).map((c) => c.display), ...Object.keys(f.words ?? {}), ...Object.values(f.words ?? {})]),
    ...UNITS.flatMap((u) => [u.id, ...u.aliases]),
  ].flatMap((phrase) => runsOf(phrase).filter((r) => r.kind === 'letters').map((r) => r.text.toLowerCase())),
);

function isNotName(word: string, eponymsAllowed: boolean): boolean {
  const lower = word.toLowerCase();
  return NOT_NAMES.has(lower) || REGISTRY_WORDS.has(lower) || (!eponymsAllowed && EPONYMS.has(lower));
}

/**
 * What a cue is: a title (`Dr`), a naming word (`name`), a relative (`wife`), another strong
 * cue (`NOK`, `next of kin`, `known as`) or a weak one (`patient`, `seen by`).
 */
type CueKind = 'title' | 'bare-title' | 'capital-title' | 'naming' | 'relative' | 'strong' | 'weak';

/**
 * Titles that are also abbreviations, so they count only with a capitalised name word right after
 * them, after blanks alone (a `bare-title` cue): in lower case (`seen by dr Patel`, common in quick
 * notes, but `mod mr` mitral regurgitation, `chest dr`), and `Mx`, which with a colon heads a
 * management plan (`Mx: Augmentin IV`). `ms` (multiple sclerosis), `miss` (a verb) and `mx` never count.
 */
const BARE_TITLES = new Set(['dr', 'mr', 'mrs', 'prof', 'Mx']);

/**
 * Titles in capitals (a `capital-title` cue): `MR` is also mitral regurgitation, magnetic
 * resonance or modified release, `MS` multiple sclerosis or mitral stenosis, `DR` a doctor in
 * shorthand, so they count only with name words in capitals right after them, after blanks alone
 * (`MR SMITH`, `MS JANE ROE`; not `MR severe`, `MR, AS`), and those words may not be the clinical
 * ones of `AFTER_CAPITAL_ABBREVIATION`. `MISS` (a verb) and `MX` (management) never count.
 */
const CAPITAL_TITLES = new Set(['MR', 'MRS', 'MS', 'DR', 'PROF']);

/**
 * Words before `MR`, `MS` or `DR` that make them abbreviations (`mod MR`, `known MS`, `no MR`,
 * `chest DR` a drain): grades and the words of a history. Lower case.
 */
const BEFORE_CAPITAL_ABBREVIATION = new Set([
  'mod', 'sev', 'severe', 'moderate', 'mild', 'trace', 'trivial', 'significant', 'functional', 'new', 'known', 'no', 'nil',
  'of', 'chest',
]);

/**
 * Words in capitals that follow `MR`, `MS` or `DR` used as abbreviations, beside the known
 * abbreviations (`ECHO`, `MRI`, `ICU`, `NIV`, `ABG`) and the not-names (`SEVERE`, `REVIEW`,
 * `AWARE`), which never count either. Lower case.
 */
const AFTER_CAPITAL_ABBREVIATION = new Set([
  // magnetic resonance (`MR ANGIO`, `MR HEAD`)
  'angio', 'angiogram', 'angiography', 'venogram', 'scan', 'head', 'brain', 'spine', 'liver', 'pelvis', 'contrast', 'mra',
  // the mitral valve (`MR JET`, `MR MURMUR`), and other valve lesions or echoes listed after it (`MR AR`, `MR TOE`)
  'jet', 'grade', 'murmur', 'valve', 'mitral', 'repair', 'ar', 'ai', 'ti', 'pi', 'tte', 'toe', 'tee', 'excluded', 'unchanged',
  'resolved', 'secondary', 'known',
  // multiple sclerosis (`MS FLARE`) and slow-release morphine (`MS CONTIN`, `MR MORPHINE`)
  'flare', 'relapse', 'relapsing', 'remitting', 'progressive', 'diagnosed', 'neuro', 'contin', 'morphine',
  // grades and queries (`MR MOD`, `MR QUERY`, `MS HISTORY`)
  'mod', 'sev', 'query', 'history',
  // a doctor in shorthand (`DR ROUND`, `DR RE SATS`, `DR BUSY`) and diabetic retinopathy (`DR SCREENING`)
  'round', 'letter', 're', 'due', 'told', 'busy', 'coming', 'screening', 'background', 'proliferative',
]);

/**
 * A past participle in capitals after `MR` or `DR` (`DR DELAYED`, `MR WORSENED`): seven letters or
 * more ending in `ED`, but not `MED`, `RED` or `EED`, the endings of given names (`MOHAMMED`,
 * `MILDRED`, `WALEED`).
 */
function isParticipleShaped(word: string): boolean {
  return word.length >= 7 && word.endsWith('ED') && !'MRE'.includes(word.charAt(word.length - 3));
}

interface Cue {
  readonly kind: CueKind;
  /** The cue as written, with the word before it for two-word cues (`known as`, `seen by`). */
  readonly label: string;
}

/** The cues of one word in any case, lower case, with their kind (`name`, `wife`, `patient`). */
const WORD_CUES: ReadonlyMap<string, CueKind> = new Map([
  ...[...NAMING_WORDS].map((w) => [w, 'naming'] as const),
  ...[...RELATIVES].map((w) => [w, 'relative'] as const),
  ...[...OTHER_STRONG_WORDS].map((w) => [w, 'strong'] as const),
  ...[...WEAK_WORDS].map((w) => [w, 'weak'] as const),
]);
/** A word longer than every cue (titles, cue words, `as`, `kin`, `by` …) is none: most words are told so by length alone. */
const LONGEST_CUE_WORD = Math.max(...[...TITLES, ...BARE_TITLES, ...CAPITAL_TITLES, ...WORD_CUES.keys(), 'as', 'kin', 'by', 'with', 'to'].map((w) => w.length));

/** The run before run `i` in lower case when only blanks separate them, else null. */
function wordBefore(text: string, runs: readonly Run[], i: number): string | null {
  const prev = runs[i - 1];
  return prev && isBlankGap(text.slice(prev.end, runs[i]!.start)) ? prev.text.toLowerCase() : null;
}

/** Run `i` with the run before it and what is between (`known as`, `seen by`); run `i` alone when first. */
function withRunBefore(text: string, runs: readonly Run[], i: number): string {
  const prev = runs[i - 1];
  return prev ? text.slice(prev.start, runs[i]!.end) : runs[i]!.text;
}

function cueAt(text: string, runs: readonly Run[], i: number): Cue | null {
  const run = runs[i]!;
  if (run.kind !== 'letters' || run.text.length > LONGEST_CUE_WORD) return null;
  if (BARE_TITLES.has(run.text)) return { kind: 'bare-title', label: run.text };
  if (TITLES.has(run.text)) return { kind: 'title', label: run.text };
  if (CAPITAL_TITLES.has(run.text)) {
    const prevWord = wordBefore(text, runs, i);
    return prevWord !== null && BEFORE_CAPITAL_ABBREVIATION.has(prevWord) ? null : { kind: 'capital-title', label: run.text };
  }
  const lower = run.text.toLowerCase();
  // All-capital words are abbreviations, not cues (`PT` physiotherapy), except `NOK`. (A word
  // starting in lower case is in capitals no more.)
  if (run.text.length > 1 && !isAsciiLowerAt(run.text, 0) && run.text === run.text.toUpperCase() && lower !== 'nok') return null;
  if (lower === 'as') return wordBefore(text, runs, i) === 'known' ? { kind: 'naming', label: withRunBefore(text, runs, i) } : null;
  if (lower === 'kin' && wordBefore(text, runs, i) === 'of') {
    const first = runs[i - 2];
    return { kind: 'strong', label: first && first.text.toLowerCase() === 'next' ? text.slice(first.start, run.end) : withRunBefore(text, runs, i) };
  }
  if (lower === 'name') {
    const prevWord = wordBefore(text, runs, i);
    if (prevWord !== null && NOT_PERSON_NAME.has(prevWord)) return null;
  }
  if (lower === 'by' || lower === 'with' || lower === 'to') {
    const prevWord = wordBefore(text, runs, i);
    return prevWord !== null && VERBS_BEFORE_PREPOSITION.has(prevWord) ? { kind: 'weak', label: withRunBefore(text, runs, i) } : null;
  }
  const kind = WORD_CUES.get(lower);
  return kind === undefined ? null : { kind, label: run.text };
}

/**
 * The mark between a cue and the name (a space when there is none), or null when the gap is no
 * cue gap: blanks with at most one mark (`name: Jane Roe`, `patient, Jane Roe`). A full stop
 * only after a title (`Dr. Patel`); after any other cue it ends the sentence.
 */
function cueGapMark(gap: string, title: boolean): string | null {
  if (gap.length === 0 || gap.length > 6) return null;
  let mark: string | null = null;
  for (let k = 0; k < gap.length; k++) {
    const ch = gap.charAt(k);
    if (isBlankGap(ch)) continue;
    if (mark === null && ((ch === '.' && title) || ch === ':' || ch === ',' || ch === '-' || ch === '=' || ch === '–')) mark = ch;
    else return null;
  }
  return mark ?? ' ';
}

/** A capitalised word: `Patel`, `McDonald`, `Zoë`; not `PEEP`, `review` or `X`. */
function isCapitalised(word: string): boolean {
  if (word.length < 2 || !isUpperChar(word.charAt(0)) || !isLowerChar(word.charAt(1))) return false;
  for (let k = 1; k < word.length; k++) if (!isLowerChar(word.charAt(k)) && !isUpperChar(word.charAt(k))) return false;
  return true;
}

/**
 * A word in capitals that may be a surname (`SMITHERTON`, `ROE`): two letters or more, a vowel,
 * and no known abbreviation (`ICU`, `ABG`, `COPD`).
 */
function isCapitalsName(word: string): boolean {
  if (word.length < 2) return false;
  let vowel = false;
  for (let k = 0; k < word.length; k++) {
    const ch = word.charAt(k);
    if (!isUpperChar(ch)) return false;
    if ('AEIOUY'.includes(ch)) vowel = true;
  }
  return vowel && !ABBREVIATIONS.has(word.toLowerCase());
}

interface NameWord {
  readonly start: number;
  readonly end: number;
  /** Index of the run after this word. */
  readonly next: number;
  readonly initial: boolean;
}

/**
 * Reads one name word at run `i`: a capitalised word (or, after a cue, one in capitals),
 * possibly joined to more by an apostrophe or a hyphen (`O'Brien`, `Smith-Jones`), or an
 * initial (`J` or `J.`). Eponyms count only when `eponymsAllowed` (after a title, or after a
 * given name that follows a naming word). A word cut before a hyphen and a lower-case word is a prefix (`Ex-smoker`, `Non-`).
 * After a title in capitals (`capitals`), only words in capitals count, and not the clinical words
 * that follow `MR`, `MS` or `DR` as abbreviations (`MR ANGIO`, `MS FLARE`).
 */
function nameWordAt(text: string, runs: readonly Run[], i: number, eponymsAllowed: boolean, capitals = false): NameWord | null {
  const run = runs[i];
  if (!run || run.kind !== 'letters') return null;
  let j = i;
  let end = run.end;
  let parts = 1;
  for (;;) {
    const next = runs[j + 1];
    if (!next || next.kind !== 'letters' || !((!capitals && isCapitalised(next.text)) || isCapitalsName(next.text))) break;
    const joint = text.slice(end, next.start);
    if (joint !== "'" && joint !== '\u2019' && joint !== '-') break;
    parts++;
    end = next.end;
    j++;
  }
  const head = run.text;
  if (parts === 1 && head.length === 1) {
    if (!isUpperChar(head)) return null;
    return { start: run.start, end: text.charAt(end) === '.' ? end + 1 : end, next: j + 1, initial: true };
  }
  if (text.charAt(end) === '-' && isLowerChar(text.charAt(end + 1))) return null;
  const headOk = (!capitals && isCapitalised(head)) || isCapitalsName(head) || (parts > 1 && head.length === 1 && isUpperChar(head));
  // A title starts a name of its own (`seen by Dr Patel`: the name is `Patel`, after `Dr`).
  if (!headOk || TITLES.has(head) || CAPITAL_TITLES.has(head) || isNotName(head, eponymsAllowed) || isNotName(text.slice(run.start, end), eponymsAllowed)) return null;
  if (capitals && (AFTER_CAPITAL_ABBREVIATION.has(head.toLowerCase()) || AFTER_CAPITAL_ABBREVIATION.has(text.slice(run.start, end).toLowerCase()) || isParticipleShaped(head))) return null;
  return { start: run.start, end, next: j + 1, initial: false };
}

/**
 * A given name that is also a common word (`June`, `May`, `Will`) at run `i`, followed by a
 * name word: `Mrs June Roe`. Only after a title or a naming word.
 */
function givenNameAt(text: string, runs: readonly Run[], i: number): NameWord | null {
  const run = runs[i];
  const next = runs[i + 1];
  if (!run || !next || run.kind !== 'letters' || !isCapitalised(run.text) || !GIVEN_NAMES.has(run.text.toLowerCase())) return null;
  if (!isBlankGap(text.slice(run.end, next.start))) return null;
  const w = nameWordAt(text, runs, i + 1, true);
  return w && !w.initial ? { start: run.start, end: run.end, next: i + 1, initial: false } : null;
}

/** Words that head a family or social history (`FHx:`, `SH:`, `Family history:`). Lower case. */
const HISTORY_HEADINGS = new Set(['fh', 'fhx', 'sh', 'shx', 'family', 'social']);

/** Endings of the names of diseases (`Sarcoidosis`, `Glaucoma`, `Anaemia`, `Autism`). */
const DISEASE_ENDINGS = ['itis', 'osis', 'oma', 'aemia', 'emia', 'pathy', 'ism'];

/** A word of six letters or more with the ending of a disease, or an eponymous disease (`Parkinsons`). */
function isDiseaseShaped(word: string): boolean {
  const lower = word.toLowerCase();
  if (lower.endsWith('s') && EPONYMS.has(lower.slice(0, -1))) return true;
  return lower.length >= 6 && DISEASE_ENDINGS.some((ending) => lower.endsWith(ending));
}

/**
 * Whether one name word after a relative and `:` or `-` is a name (`wife: Mary`; `NOK: Peter`
 * needs no such test, `NOK` being a strong cue): capitalised, not in capitals (`Father: COPD`); no disease
 * (`Mother - Sarcoidosis`); the end of its phrase, so no word follows it (`Mother: Breast cancer`,
 * but `daughter - Anne, 07700 900123`); and no history heading earlier in the text
 * (`FHx: Father - Hypothyroid`), where the words after a relative are conditions.
 */
function isLoneNameAfterRelative(text: string, word: NameWord, headingBefore: boolean): boolean {
  if (headingBefore || !isUpperChar(text.charAt(word.start)) || !isLowerChar(text.charAt(word.start + 1))) return false;
  if (isDiseaseShaped(text.slice(word.start, word.end))) return false;
  let k = word.end;
  while (k < text.length && isBlankGap(text.charAt(k))) k++;
  return k === text.length || !isLetterChar(text.charAt(k));
}

/** The index of the first run that heads a history, or the number of runs when none does. */
function firstHistoryHeading(runs: readonly Run[]): number {
  for (let k = 0; k < runs.length; k++) if (HISTORY_HEADINGS.has(runs[k]!.text.toLowerCase())) return k;
  return runs.length;
}

/** Whether the run is there and starts with what may be a capital (`mayBeUpperAt`). */
function startsWithCapital(text: string, run: Run | undefined): boolean {
  return run !== undefined && mayBeUpperAt(text, run.start);
}

/** Adds the names in `text` (whose runs are `runs`) to `out`. */
export function findNames(text: string, runs: readonly Run[], out: PrivacyMatch[]): void {
  // Found when a relative with a mark first needs it (most texts have none).
  let heading = -1;
  for (let i = 0; i < runs.length; i++) {
    // A name's first word starts with a capital, one run after its cue or two (`name is Jane
    // Roe`): most runs are no cue of a name, told so without a look at their letters.
    if (!startsWithCapital(text, runs[i + 1]) && !startsWithCapital(text, runs[i + 2])) continue;
    const found = cueAt(text, runs, i);
    if (!found) continue;
    const cue = runs[i]!;
    let j = i + 1;
    const first = runs[j];
    if (!first) continue;
    const mark = cueGapMark(text.slice(cue.end, first.start), found.kind === 'title');
    if (mark === null) continue;
    // A title that is also an abbreviation takes the name right after it, after blanks only (`mod mr, Severe AS`).
    if ((found.kind === 'bare-title' || found.kind === 'capital-title') && mark !== ' ') continue;
    let weak = found.kind === 'weak';
    if (found.kind === 'relative') {
      // `lives with wife, Independent ADLs`: a comma ends the cue; `Mother - Asthma`, `Father: COPD`
      // head a history and need two name words, or one that ends its phrase (`wife: Mary`).
      if (mark === ',') continue;
      if (mark !== ' ') weak = true;
    }
    // Eponyms are surnames after a title (`Dr Miller`) and after a given name following a naming
    // word (`name Jo Allen`); `name Berlin` alone stays a definition.
    const capitals = found.kind === 'capital-title';
    const title = found.kind === 'title' || found.kind === 'bare-title' || capitals;
    const naming = found.kind === 'naming';
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
      // A given name that is also a word is not read in capitals (`DR WILL PRESCRIBE`, `MS MAY RELAPSE`).
      const w = nameWordAt(text, runs, j, title || (naming && words.length > 0), capitals) ?? (words.length === 0 && (title || naming) && !capitals ? givenNameAt(text, runs, j) : null);
      if (!w) break;
      words.push(w);
      prevEnd = w.end;
      j = w.next;
    }
    // Drop trailing initials: an initial alone is no name (`Dr A`).
    while (words.length > 0 && words[words.length - 1]!.initial) words.pop();
    const full = words.filter((w) => !w.initial).length;
    if (full === 0) continue;
    // `name: ROE, Jane`, `Name - Roe, Jane`: a surname, a comma, then the given names; after
    // `patient` or `pt` only with the surname in capitals (`Patient: SMITH, John`, as wristbands
    // print it; not `patient: Anxious, Tearful`).
    if (words.length === 1 && (naming || (PATIENT_WORDS.has(found.label.toLowerCase()) && isCapitalsName(text.slice(words[0]!.start, words[0]!.end))))) {
      const next = runs[j];
      const comma = next ? text.slice(prevEnd, next.start) : '';
      const given = comma === ',' || comma === ', ' ? nameWordAt(text, runs, j, true) : null;
      if (given && !given.initial) {
        words.push(given);
        j = given.next;
      }
    }
    if (weak && words.length < 2) {
      if (found.kind !== 'relative') continue;
      if (heading < 0) heading = firstHistoryHeading(runs);
      if (!isLoneNameAfterRelative(text, words[0]!, heading < i)) continue;
    }
    out.push(match('name', text, words[0]!.start, words[words.length - 1]!.end, found.label));
    i = j - 1;
  }
}
