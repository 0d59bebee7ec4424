/**
 * Checks whose findings are collected while parsing and reading values: the parser and the
 * value reader record the problem under the check's alias, and these checks report it.
 */
import type { ReadCheckAlias } from '../analysis/read-issues';
import { pairsAcrossLines, writesFio2 } from '../analysis/timeline';
import { lineFixesToFixes, toRange, type LineNode, type SyntaxCheckAlias, type SyntaxIssue } from '../syntax/tree';
import { defineCheck, forHeaderLines, forTimepointIssueLines, type CheckContext, type CheckDef, type CheckDoc, type CheckTag, type TimepointContext } from './check';
import type { Fix, Severity } from '../types';
import type { ReadIssue } from '../analysis/read-issues';
import { targetMoveFixes } from './target-move';

const NO_FIXES: readonly Fix[] = [];

const FORMAT_RULE = 'format rule (grammar/README.md)';

/** `alsoRead`: the check's alias is also one the timeline reports read issues under (a time it cannot hold). */
function syntaxCheck(code: string, alias: SyntaxCheckAlias, title: string, severity: Severity, doc: CheckDoc, alsoRead?: ReadCheckAlias & SyntaxCheckAlias): CheckDef {
  const visit = (ctx: CheckContext, node: LineNode) => {
    if (node.issues.length === 0) return;
    for (const issue of node.issues) {
      if (issue.check !== alias) continue;
      ctx.report({ range: toRange(node.line, issue.span), message: issue.message, fixes: lineFixesToFixes(node.line, issue.fixes), ...(issue.severity ? { severity: issue.severity } : {}) });
    }
  };
  return defineCheck({
    code, alias, title, severity, tags: ['syntax'], doc, source: FORMAT_RULE,
    run(ctx) {
      forHeaderLines(ctx, visit);
      if (alsoRead === undefined) return;
      for (const issue of ctx.analysis.timeline.readIssues) {
        if (issue.check === alsoRead) ctx.report({ range: toRange(issue.line, issue.span), message: issue.message, fixes: lineFixesToFixes(issue.line, issue.fixes) });
      }
    },
    runTimepoint(ctx) {
      forTimepointIssueLines(ctx, visit);
    },
  });
}

/**
 * `moreFixes`: fixes of a finding that need the whole note, not its line alone (the move of an SpO2
 * target off a patient line to an oxygen line), after those the reader made.
 */
function readCheck(code: string, alias: ReadCheckAlias, title: string, severity: Severity, tags: readonly CheckTag[], source: string, doc: CheckDoc, moreFixes?: (ctx: CheckContext, issue: ReadIssue) => readonly Fix[]): CheckDef {
  return defineCheck({
    code, alias, title, severity, tags, doc, source,
    run(ctx) {
      for (const issue of ctx.analysis.timeline.readIssues) {
        if (issue.check !== alias) continue;
        const fixes = lineFixesToFixes(issue.line, issue.fixes);
        const more = moreFixes === undefined ? NO_FIXES : moreFixes(ctx, issue);
        ctx.report({
          range: toRange(issue.line, issue.span),
          message: issue.message,
          fixes: more.length === 0 ? fixes : [...fixes, ...more],
          ...(issue.related ? { related: issue.related.map((r) => ({ range: toRange(r.line, r.span), message: r.message })) } : {}),
        });
      }
    },
  });
}

export const unknownSection = syntaxCheck('PN101', 'unknown-section', 'Unknown section', 'error', {
  fires: 'A line starts with a word that is not a section (and is not `@`, a comment or blank).',
  example: 'vitls hr 118',
  fix: 'Start the line with a section: patient, place, units, vitals, oxygen, abg, vbg, labs, vent or note. A key written alone (`hr 118`) is offered its section.',
});

export const missingValue = syntaxCheck('PN102', 'missing-value', 'Key without a value', 'error', {
  fires: 'A key is followed by nothing, a comma or another key; or by a value of the wrong shape, which would not be read: one number or three where the key takes two joined by a slash (`bp 120`, `bp 120/80/60`), or two where it takes one (`hr 80/90`). A word with nothing after it that is no key of its line is reported once, as an unknown key (PN201), with the key or device it is near (`oxygen roomair`). Also a snippet\'s placeholder left unfilled, a word in angle brackets (`vt <VT> mL`, `bp <sys>/<dia>`, `oxygen cannula <flow> L/min`): one finding over the key, the placeholders and the unit after them.',
  example: 'vitals hr, rr 26',
  fix: 'Write the value after the key (`hr 118`), or remove the key.',
});

export const decimalComma = syntaxCheck('PN103', 'decimal-comma', 'Decimal comma', 'warning', {
  fires: 'A number is written with a decimal comma (`7,35`). Commas separate items, so the value is easy to misread. A comma before exactly three digits (`altitude 1,650 m`) where a thousands separator would also give a possible value is reported with both readings, and the value is not used in calculations until it is rewritten.',
  example: 'abg ph 7,35, pco2 41',
  fix: 'Write a decimal point (`7.35`); the quick fix does it, also for the whole note. For `1,650` choose `1650` or `1.650`: neither quick fix is applied to the whole note.',
});

export const badTime = syntaxCheck('PN104', 'bad-time', 'Unreadable time', 'error', {
  fires: 'A timepoint line has no time, an impossible time of day, an unreadable offset, a calendar date, a time on the 12-hour clock that the 24-hour clock reads otherwise (`9:00 pm`, read as 09:00 it would be 12 hours early, or `12:30 am`; `8:00 am` is left as it is), or a time beyond what a note can span (day 100000 written, or more than 100000 days from day 1 reached by offsets and clock times past midnight). As a warning: an offset split by a blank (`@ +2h 30m`), which reads as `+2h` with a label starting `30m`.',
  example: '@ 25:10 handover',
  fix: 'Write `@ day N HH:MM`, `@ HH:MM` (on the 24-hour clock: `21:00`, which the quick fix writes for `9:00 pm`) or an offset such as `@ +2h30` (no blanks inside it; the quick fix joins a split one). Calendar dates are not part of the format: use relative days.',
}, 'bad-time');

export const strayText = syntaxCheck('PN105', 'stray-text', 'Stray text', 'error', {
  fires: 'A number (or other text) appears where a key was expected, or a number is typed with digits other than 0–9 (fullwidth `８０`, Arabic-Indic `٨٠`), which are not read as a number, or a value that starts with a dash other than a minus sign (`be –5`: an en dash, as a word processor writes one; the signs of the format are `-`, `+` and `−`), which is not read either. At information level: a full stop that ends a line of items (`hr 80.`, read as `hr 80`), or a comma that separates nothing (at the start of a line, right after its section word or `@`, a second one between two items, where a value may be missing, or between the time and the label of a timepoint); the line is read without it. A number in brackets anywhere but right after a blood pressure, one not closed (`bp 120/80 (93`), or one with more glued after its `)` (`bp 120/80 (93)x`) is not read as the measured mean; the blood pressure is.',
  example: 'vitals hr 118 120',
  fix: 'Give the number its key (`rr 20`), or remove it; write a number in the digits 0–9, and a negative value with a minus sign (`be -5`; a fix does each). A pair of pressures after `niv`, the higher first (`16/6`), is offered its keys (`ipap 16, epap 6`). A percentage without a key after a comma on an oxygen line (`hfnc 40 L/min, 60 %`: a comma ends the numbers read after the device) is one finding, offered its key (`fio2 60 %`), the only key of the section that takes %; so is one right after the flow of a device set by its flow (`mask 10 L/min 40 %`, `cannula 2 L/min 28%`: a percentage is none of its settings, and the FiO2 it gives is not fixed) or after the number of NIV, CPAP or room air. Likewise a number with a unit and no key, where one key of the line\'s section alone takes that unit (4 L/min on an oxygen line: the flow; 450 mL on a vent line: the tidal volume; not 5 cmH2O on a vent line, which several keys take): one finding over both, offered that key (`flow 4 L/min`), preferred unless the line already gives it (`hfnc 40 L/min 50 L/min`, a second flow, not read). On a vitals line a number in L/min (4 L/min there) is said to be more likely an oxygen flow written in the wrong section than a cardiac output: where it is all the line holds, the line is offered as an oxygen line (`oxygen flow 4 L/min`) first and `co` second, neither preferred; among other items `co` only, and nothing where the line gives a cardiac output already. A full stop or a comma that separates nothing has a fix that removes it, also for the whole note.',
});

export const badShorthand = syntaxCheck('PN106', 'bad-shorthand', 'Unreadable shorthand gas', 'error', {
  fires: 'A shorthand gas (`abg pH/PCO2/PO2/HCO3`) has fewer than 2 or more than 4 numbers.',
  example: 'abg 7.28/56/71/26/-2',
  fix: 'Keep the order pH/PCO2/PO2/HCO3 and write further values as items: `abg 7.28/56/71/26, be -2`.',
});

/**
 * A bare number of a Venturi setting after `venturi` (`oxygen venturi 28`), which the parser reads
 * as the FiO2 in % (`venturiNumberKey`): said, so the reading is seen, with fixes that write it.
 */
export const venturiSetting = defineCheck({
  code: 'PN321',
  alias: 'venturi-setting',
  title: 'Bare number after venturi read as its FiO2',
  severity: 'information',
  tags: ['plausibility'],
  doc: {
    fires: 'The number right after `venturi` on an oxygen line is written bare and is one of the oxygen percentages of the Venturi settings, 24 to 60 (`oxygen venturi 28`). A Venturi mask is set by the oxygen fraction it gives, at a flow of some 2 to 15 L/min the device names, so the number is read as the FiO2 in % (28 %), not as a flow of 28 L/min, and used as a stated FiO2 (P/F, A–a gradient). Not reported where the number can only be the FiO2 or only a flow, and read as such: a fraction up to 1 (`venturi 0.4`) or a percentage (`venturi 40 %`) is the FiO2, a number in L/min (`venturi 8 L/min`) or any other bare number (`venturi 8`) the flow. Nor where the line writes a `fio2` too (`venturi 28, fio2 0.28`), or another oxygen line of the timepoint that names no device does (`oxygen fio2 0.28` below or above), which says what the number is: where the two agree the FiO2 is stated once, and where they disagree PN206 names both.',
    example: '@ 08:00\noxygen venturi 28',
    fix: 'Write which it is: `venturi fio2 28 %` for the FiO2 read, or `venturi 28 L/min` for a flow. The quick fixes write each. Where a flow in L/min follows the number (`venturi 28 8 L/min`, read as the flow), the number is not the flow: only the FiO2 is offered, and its fix gives the flow its key too (`venturi fio2 28 % flow 8 L/min`).',
  },
  source: "O'Driscoll BR, Howard LS, Earis J, Mak V, on behalf of the British Thoracic Society Emergency Oxygen Guideline Group. BTS guideline for oxygen use in adults in healthcare and emergency settings. Thorax 2017;72(Suppl 1):ii1–ii90 (the citation read in its entry in the National Guideline Clearinghouse summary 11253; a 28 % Venturi mask at 4 L/min read in its reproduction in table 1 of a Breathe review, adapted from tables 1–4 of the 2008 BTS guideline, at breathe.ersjournals.com; its other Venturi settings, 24, 31, 35, 40 and 60 % oxygen, each at its own oxygen flow of some 2 to 15 L/min, read in a teaching table of Venturi colour codes at md3.info/skills/oxygen/amplified, not in the guideline itself). European Respiratory Society, European Lung White Book, Principles of respiratory therapy, figure 2: Venturi masks set the inspired oxygen concentration, colour-coded from 24 to 60 %",
  runTimepoint(ctx) {
    forTimepointIssueLines(ctx, visitVenturiSetting);
  },
});

function visitVenturiSetting(ctx: TimepointContext, node: LineNode): void {
  visitDeviceFio2(ctx, node, 'venturi-setting');
}

/**
 * Reports the parser's issue `check` on a line, unless the line writes a `fio2` of its own, or
 * another oxygen line of its timepoint writes one that states the same FiO2 (`pairsAcrossLines`):
 * the FiO2 read from the number after the device is then stated again, and either agrees with it
 * (nothing to say) or not (PN206 names both). Its fix would write a second `fio2`.
 */
function visitDeviceFio2(ctx: TimepointContext, node: LineNode, check: 'venturi-setting' | 'high-flow-percent'): void {
  if (node.issues.length === 0 || node.kind !== 'section') return;
  let issue: SyntaxIssue | null = null;
  for (const found of node.issues) if (found.check === check) issue = found;
  if (issue === null) return;
  if (writesFio2(node.items)) return;
  const lines = ctx.analysis.tree.lines;
  for (const s of ctx.timepoint.stated) {
    if (s.fieldId === 'fio2' && s.section === 'oxygen' && s.line !== node.line && s.item.implied === null && pairsAcrossLines(node, lines[s.line]!)) return;
  }
  ctx.report({ range: toRange(node.line, issue.span), message: issue.message, fixes: lineFixesToFixes(node.line, issue.fixes) });
}

/**
 * A percentage after a high-flow device (`oxygen hfnc 60 %`, `hfnc 40 L/min 60 %`), which the parser
 * reads as the FiO2 it gives: said, so the reading is seen, with fixes that write it.
 */
export const highFlowPercent = defineCheck({
  code: 'PN323',
  alias: 'high-flow-percent',
  title: 'Percentage after hfnc read as its FiO2',
  severity: 'information',
  tags: ['plausibility'],
  doc: {
    fires: 'A number written with `%` follows `hfnc` (or `highflow`) on an oxygen line without a key, right after the device (`oxygen hfnc 60 %`) or after its flow (`oxygen hfnc 40 L/min 60 %`). A high-flow device is set by a total gas flow in L/min and by the oxygen fraction of its blender, and a flow is never written in %, so the number is read as the FiO2 (60 %, 0.60) and used as a stated FiO2 (P/F, A–a gradient, exports). Not reported where the line writes a `fio2` of its own, or another oxygen line of the timepoint that names no device does: where the two agree the FiO2 is stated once; where they disagree PN206 names both, and the `fio2` written is used. After other devices a percentage stays a unit the flow does not take (PN203), offered as the FiO2 with its key: a cannula or a simple or reservoir mask gives an FiO2 that is not set, and NIV and CPAP may take their oxygen at a flow.',
    example: '@ 08:00\noxygen hfnc 60 %',
    fix: 'Write which it is: `hfnc fio2 60 %` for the FiO2 read, or `hfnc 60 L/min` for a flow (offered only where no flow is written). The quick fixes write each.',
  },
  source: 'Guia M, Alpay N, Gerardo A, et al. High-flow nasal oxygen therapy in acute hypoxemic respiratory failure: concise review on technology and initial methodology. Turk Thorac J 2021;22(6):494–500 (an air–oxygen blender gives up to 100 % oxygen, at a flow of up to 80 L/min). Li J, Scott JB, Fink JB, et al. Optimizing high-flow nasal cannula flow settings in adult hypoxemic patients based on peak inspiratory flow during tidal breathing. Ann Intensive Care 2021;11:164 (the flow set in L/min, the FiO2 titrated on its own)',
  runTimepoint(ctx) {
    forTimepointIssueLines(ctx, visitHighFlowPercent);
  },
});

function visitHighFlowPercent(ctx: TimepointContext, node: LineNode): void {
  visitDeviceFio2(ctx, node, 'high-flow-percent');
}

export const unknownKey = readCheck('PN201', 'unknown-key', 'Unknown key', 'error', ['units'], FORMAT_RULE, {
  fires: 'An item key is not one of the keys (or aliases) of its section.',
  example: 'vitals hr 118, rrr 26',
  fix: 'Use a key of the section; the quick fix offers the nearest ones, and at the start of an oxygen line the nearest device, also for a device of two words with one misspelt (`room aor` → `room air`, both words at once). A key of another line is not misspelt: the message says where it belongs, and no key of another quantity is offered (`hb` on a vitals line is not `hr`), but on a vent line `rr`, common shorthand for the set rate, is offered `rate`, never applied unasked. Words commonly written for a ventilator pressure are offered what they stand for, never applied unasked (`ip`: `pinsp`, then `pip`; `pmax`: `peak`; on an NIV oxygen line `ip` and `ep`: `ipap` and `epap`; at the start of an oxygen line `bipap` or `bpap`: the device `niv`), and ventilator times, the I:E ratio and APRV levels, which have no key (`tinsp`, `ie`, `plow`), are offered none. The target of SIMV written after it with a blank (`mode SIMV PC`, `mode SIMV VC`) is offered, preferred, the one mode word it stands for (`SIMV-PC`, `SIMV-VC`). NIV and CPAP are written on oxygen lines: a vent line that names NIV (`mode NIV`) or holds only their pressures (`ipap`, `epap`, `level`, or `cpap 8`) besides keys an oxygen line takes too (`fio2`, `flow`) is offered, preferred, as that oxygen line (`oxygen niv ipap 16, epap 5`), its other items and comment as written; one that also holds keys only a vent line takes (`vt`, `rate`) is not moved, and the message says why. An SpO2 target written on a patient or place line (`target 88-92 %`) is offered a move to the oxygen line of the timepoint it applies to (the first timepoint for one before it), after that line\'s items, or to a new oxygen line after the timepoint\'s `@` line where it has none; the line it leaves keeps its other items and their commas. Not offered where that oxygen line already has a target. grammar/README.md lists the keys of each section.',
}, (ctx, issue) => targetMoveFixes(ctx.analysis, issue.line, issue.span));

export const unknownUnit = readCheck('PN202', 'unknown-unit', 'Unknown unit', 'error', ['units'], FORMAT_RULE, {
  fires: 'The unit after a value is not a unit Pneumark knows.',
  example: 'abg po2 71 mmhgg',
  fix: 'Write one of the units the field takes (listed in the message), or leave the unit out to use the default.',
});

export const unitNotAllowed = readCheck('PN203', 'unit-not-allowed', 'Unit not allowed for this field', 'error', ['units'], FORMAT_RULE, {
  fires: 'The unit is known but measures something else (e.g. a rate in mmHg), or is one the field is not written in (a blood pressure in kPa).',
  example: 'vitals hr 118 mmHg',
  fix: 'Write a unit the field takes, or none. A value written in a unit of the field\'s kind that the field does not take (`map 12 kPa`, `hr 1.2 Hz`) is offered converted (`map 90 mmHg`, `hr 72 /min`; a blood pressure both its numbers) where the result is possible, first where the number as written would be unusual in the field\'s unit and the converted one is not; a concentration never is (its units are read by one substance\'s molar mass). A percentage after an oxygen device (`mask 40 %`) is offered as the FiO2 it gives (`mask fio2 40 %`) before a flow in L/min; after `venturi` and `hfnc`, which are set by their FiO2, it is read as the FiO2 (PN323 says so after `hfnc`).',
});

export const otherUnitLikely = readCheck('PN204', 'other-unit-likely', 'Value reads as another unit', 'warning', ['units', 'plausibility'], 'common practice, no source: the soft bounds of the field registry, widened for PaO2 and PaCO2 (our convention), and for the height and weight of a patient under 18 years down to their hard minimum, for the length of an infant under a year down to a floor that rises with age (24 cm until 16 weeks, the −3 SD of a girl born at 24 weeks in the INTERGROWTH-21st very preterm size at birth reference 2016, then the girls\' −3 SD of the WHO Child Growth Standards 2006 at the age corrected for that early birth, less 10 cm: read in their reproductions, see physiology/growth.ts; the margin is ours, no source)', {
  fires: 'A value written without a unit is implausible in the unit in force but ordinary in another unit the field takes (po2 9.1 read in mmHg looks like kPa; temp 101.2 read in °C looks like °F). The value is not used in calculations until the unit is written. A critical value that is real in the unit in force is never doubted: a bare PaO2 of 20–30 mmHg or PaCO2 of 150–200 mmHg is read as written and flagged as unusual (PN302) instead, so it stays in the readings. A bare height or weight is judged against an adult\'s size (120–220 cm, 25–250 kg) only where the age in force is 18 years or more, or none is stated: under 18 years a child\'s size, from 20 cm and 0.3 kg (their hard minimum) up to the same maximum, is read in cm and kg (`patient age 8 mo, height 70` is 70 cm, not 70 in), and only a number impossible in cm or kg is doubted, where another unit makes it a child\'s size (`height 0.72`, 72 cm in m). Under a year a length starts at a floor that rises with age (24 cm until 16 weeks after birth, 46 cm at 8 months; see PN302): a bare height below it is offered a unit only where that unit makes it the floor or more (`height 25` of an 8-month-old, 25 in), else it is impossible (PN301: an 8-month-old\'s `height 10` is not offered inches, 25 cm). The age is the header\'s for a header line and the timepoint\'s for a timepoint\'s, whichever of its lines states it.',
  example: 'abg po2 9.1',
  fix: 'Write the unit (`po2 9.1 kPa`), convert the value, or set `units gas kPa` for the note.',
});

export const unknownWord = readCheck('PN205', 'unknown-word', 'Unknown word value', 'error', ['units'], FORMAT_RULE, {
  fires: 'A field that takes a word (sex, device, gas unit) has a word Pneumark does not know, or the ventilator mode, which takes any word, has a number (`mode 10`).',
  example: 'oxygen device canula',
  fix: 'Use one of the words listed in the message; the quick fix offers the nearest.',
});

export const duplicateKey = readCheck('PN206', 'duplicate-key', 'Stated twice at one timepoint', 'warning', ['timeline'], FORMAT_RULE, {
  fires: 'The same field is stated twice in the same section at one timepoint. The later value is used; where it is not usable itself (an impossible value, a unit in doubt), neither is. The FiO2 read from the number after the device (the Venturi setting, `oxygen venturi 28`) and a `fio2` written on the same line state it twice only where they disagree, as fractions at the precision of the less precise of the two as written: `venturi 28, fio2 0.28` and `venturi 28 %, fio2 0.3` are one FiO2 and not reported, `venturi 28, fio2 0.35` is, with both values and where each comes from. So are the two on oxygen lines of their own at one timepoint (`oxygen venturi 28`, then `oxygen fio2 0.35`, in either order), where the line of the `fio2` names no device (of two such `fio2` lines above the device\'s, the later, the one in force): the message names both lines, and the two lines hold as one (the device and the `fio2` written). The `fio2` written is used (P/F, A–a gradient, exports), in every case. A `fio2` on a vent line is the ventilator\'s, and not compared (PN311 reports the two lines). An oxygen device named again at its timepoint continues that therapy and is not reported (`oxygen niv ipap 14, epap 6`, then `oxygen niv fio2 0.4`: both pressures stay); another device named there replaces it, and the message names the settings of the lines above that are no longer in force (`oxygen niv ipap 14, epap 6`, then `oxygen hfnc 50 L/min`: the IPAP and EPAP of that line).',
  example: '@ 08:00\nabg po2 71\nabg po2 64',
  fix: 'Remove one, or put the second measurement under its own timepoint (`@ 08:20`). For a Venturi setting and a `fio2` that disagree, the quick fixes keep either one; on two lines each leaves one line that states the FiO2 once (`oxygen venturi fio2 0.35`, or `oxygen venturi fio2 28 %`). For a device replaced by another at one timepoint, where the later line writes only settings of the first device, the quick fix writes that device on it (`oxygen niv ipap 14, epap 6`, then `oxygen hfnc 50 L/min` → `oxygen niv 50 L/min`): one therapy, whose settings above stay; where the therapy did change, put the later line under its own timepoint.',
});
