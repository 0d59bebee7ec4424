/**
 * Interpretations reported as information findings, one code per topic, so that each can be
 * filtered or switched off. Only abnormal readings are reported; every reading is still shown
 * by `pneumark show` and in hovers.
 */
import type { InterpretationTopic } from '../derive/model';
import { toRange, type LineNode } from '../syntax/tree';
import type { Range } from '../types';
import { defineCheck, type CheckDef, type CheckDoc, type TimepointContext } from './check';
import type { Kept } from '../util/small-store';

function interpretationCheck(code: string, alias: string, title: string, topics: readonly InterpretationTopic[], source: string, doc: CheckDoc): CheckDef {
  return defineCheck({
    code, alias, title, severity: 'information', tags: ['interpretation'], doc, source,
    runTimepoint(ctx) {
      // Indexed: most timepoints have no readings (a shared empty list), and a `for…of` over lists
      // of two kinds is left unoptimised, making an iterator at every timepoint.
      const readings = ctx.derivation.interpretations;
      for (let k = 0; k < readings.length; k++) {
        const i = readings[k]!;
        if (!i.notable || i.line === null || !topics.includes(i.topic)) continue;
        ctx.report({ range: readingRange(ctx, i.line), message: i.text });
      }
    },
  });
}

/** The last range a reading of this timepoint was shown at, and the line it was worked out for. */
interface LastRange {
  node: LineNode | undefined;
  line: number;
  range: Range | null;
}

const LAST_RANGE: Kept<LastRange, TimepointContext> = { name: 'last reading range', compute: () => ({ node: undefined, line: -1, range: null }) };

/**
 * Where a reading is shown: its line from the section word to the last item. A gas gives several
 * readings (oxygenation, ventilation, acid–base) on one line, reported one after another by the
 * checks of its timepoint: they share one range (ranges are never changed once made).
 */
function readingRange(ctx: TimepointContext, line: number): Range {
  const last = ctx.shared(LAST_RANGE);
  const node = ctx.analysis.tree.lines[line];
  if (last.range && last.node === node && last.line === line) return last.range;
  let start = 0;
  let end: number;
  if (node?.kind === 'section') {
    const items = node.items;
    start = node.sectionToken.span.start;
    end = items.length > 0 ? items[items.length - 1]!.span.end : node.sectionToken.span.end;
  } else end = node?.text.length ?? 0;
  last.node = node;
  last.line = line;
  last.range = toRange(line, { start, end });
  return last.range;
}

/** A reading is information, never a fault: the same advice for every reading check. */
const READING_FIX = 'Nothing to fix: a reading to support, not replace, clinical judgement. The readings of one gas come together, so the example also shows the other reading checks (PN410–PN413).';

export const oxygenationReading = interpretationCheck('PN410', 'oxygenation-reading', 'Oxygenation reading', ['oxygenation', 'oxygenation-band'], 'hypoxaemia PaO2 < 60 mmHg (setting): common practice, no source; oxygenation bands: ARDS Definition Task Force, JAMA 2012;307:2526–2533 (the bands read in its table as adapted in Crit Care 2012, cc11867); children on invasive ventilation graded by the oxygenation index: Khemani RG and coauthors for the PALICC Group, Pediatr Crit Care Med 2015;16(5 Suppl 1):S23–S40 (read in its abstract), and the comparison of the two definitions in BJA Education 2022;22(9):364–370, its table 1', {
  fires: 'A gas is consistent with hypoxaemia, or with oxygenation supported by supplemental oxygen (P/F ≤ 300 mmHg on oxygen); with PEEP or CPAP ≥ 5 cmH2O, the P/F band of the Berlin definition is named — as an oxygenation band, never as a diagnosis. On noninvasive support (EPAP on NIV, CPAP on an oxygen line) the definition names only its 200–300 mmHg band, so a P/F at or below 200 mmHg there is said to be below it, with no lower band named. Not under HFOV: an oscillator sets a mean airway pressure and no PEEP, so the band\'s condition on PEEP does not apply there (the oxygenation index is shown instead). Nor for a patient under 18 years on invasive ventilation: the bands were made in adults, and the pediatric consensus (PALICC 2015) grades a ventilated child by the oxygenation index; the reading says so, without a finding.',
  example: '@ 08:00\noxygen room air\nabg 7.44/34/52/23',
  fix: READING_FIX,
});

export const ventilationReading = interpretationCheck('PN411', 'ventilation-reading', 'Ventilation reading', ['ventilation'], 'hypercapnia PaCO2 > 50 mmHg and hypocapnia < 35 mmHg (settings): common practice, no source', {
  fires: 'PaCO2 is above the hypercapnia threshold or below the hypocapnia threshold. A PaCO2 on a threshold is on neither side (50 mmHg is not hypercapnia), and one written in kPa is read at the resolution it was written with, so 6.7 kPa is on the 50 mmHg threshold as 50 mmHg is.',
  example: '@ 08:00\nabg 7.25/68/70/29',
  fix: READING_FIX,
});

export const respiratoryFailureReading = interpretationCheck('PN412', 'respiratory-failure-reading', 'Respiratory failure reading', ['respiratory-failure', 'hypoxaemia-mechanism'], 'type 1: hypoxaemia without hypercapnia (normal or low PaCO2, or raised but not above the hypercapnia threshold); type 2: hypoxaemia with hypercapnia (common practice, no source); mechanism from PiO2, A–a gradient and PaCO2 (alveolar gas equation)', {
  fires: 'The gas is consistent with type 1 or type 2 respiratory failure; the mechanism of hypoxaemia the values are consistent with (low inspired oxygen, hypoventilation, a raised A–a gradient, or a mix) is named.',
  example: '@ 08:00\noxygen room air\nabg 7.28/62/51/28',
  fix: READING_FIX,
});

export const acidBaseReading = interpretationCheck('PN413', 'acid-base-reading', 'Acid–base reading', ['acid-base'], "primary disorder and compensation: Albert, Dell & Winters 1967; Narins & Emmett 1980; Adrogué & Madias 2010; Berend and coauthors 2014 (where each rule was read, or that it was recalled, is said in the sources of the expected PaCO2 and expected HCO3 values)", {
  fires: 'The gas is consistent with an acid–base disorder: the primary disorder, whether the compensation is in the expected range, a second disorder the values are also consistent with, and acute versus chronic for a respiratory disorder, each with the numbers it rests on. A gas whose pH, PaCO2 and HCO3 do not fit together (PN402) is not interpreted, and no expected compensation is worked out from it.',
  example: '@ 08:00\nabg 7.21/24/95/9.5',
  fix: READING_FIX,
});

export const venousGasReading = interpretationCheck('PN414', 'venous-gas-reading', 'Venous gas reading', ['venous'], 'Venous pH about 0.03 below the arterial pH: Bloom BM, Grundlingh J, Bestwick JP, Harris T, Eur J Emerg Med 2014, and Kelly AM, Emerg Med Australas 2010 (both read in their abstracts). A venous PCO2 above 45 mmHg as a screen for a PaCO2 above 50 mmHg: Kelly AM, Kerr D, Middleton P, J Emerg Med 2005 (read in its abstract). Arterial pH reference interval 7.35–7.45: common practice, no source.', {
  fires: 'A venous gas (`vbg`) is stated at a timepoint with no arterial gas, and its pH, taken as about 0.03 below the arterial pH, is consistent with acidaemia or alkalaemia, or its PvCO2 is above 45 mmHg, which is consistent with arterial hypercapnia but no proof of it. A venous PCO2 can differ from the arterial one by 20 mmHg either way, so it is read only as a screen: at or below 45 mmHg it is consistent with no arterial hypercapnia (a PaCO2 not above 50 mmHg). A venous PO2 is never read as oxygenation. The arterial readings (PN410–PN413) are not applied to venous values; with an arterial gas at the same timepoint, the arterial gas is read instead. A venous gas whose pH, PvCO2 and HCO3 do not fit together (PN402) is not read.',
  example: '@ 08:00\nvbg ph 7.24, pco2 68, hco3 28.5',
  fix: 'Nothing to fix: a reading to support, not replace, clinical judgement. Where oxygenation or an exact PaCO2 matters, an arterial gas measures them.',
});
