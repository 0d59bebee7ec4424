/** pH, PaCO2 and HCO3 of one gas must agree (Henderson–Hasselbalch). */
import { acidBaseConsistency, HCO3_CONSISTENCY_TOLERANCE, SOURCES } from '../physiology';
import { gasPressureText, showsKpa } from '../present';
import { toRange } from '../syntax/tree';
import { formatNumber } from '../util/format';
import { defineCheck } from './check';

export const gasInconsistent = defineCheck({
  code: 'PN402',
  alias: 'gas-inconsistent',
  title: 'pH, PaCO2 and HCO3 disagree',
  severity: 'warning',
  tags: ['physiology'],
  doc: {
    fires: `The reported HCO3 differs from the HCO3 that the reported pH and PaCO2 give by Henderson–Hasselbalch by more than max(${HCO3_CONSISTENCY_TOLERANCE.absoluteMmolL} mmol/L, ${HCO3_CONSISTENCY_TOLERANCE.relative * 100} %). An analyser calculates HCO3 from pH and PaCO2, so a disagreement points to a transcription error or values from different samples.`,
    example: '@ 08:00\nabg 7.40/40/90/15',
    fix: 'Check the three values against the analyser print-out; the hover shows the HCO3 the pH and PaCO2 imply.',
  },
  source: `${SOURCES['henderson-hasselbalch']} ${SOURCES['pneumark-consistency-tolerance']}`,
  runTimepoint(ctx) {
    const tp = ctx.timepoint;
    // Only an HCO3 stated here is checked (asked without building the value).
    if (tp.values.originOf('hco3') !== 'here') return;
    {
      const ph = tp.values.get('ph');
      const paco2 = tp.values.get('paco2');
      const hco3 = tp.values.get('hco3');
      if (!ph || !paco2 || !hco3) return;
      if (hco3.origin.kind !== 'here') return;
      const all = [ph, paco2, hco3];
      if (all.some((v) => !v.stated.usable || v.stated.value === null)) return;
      const result = acidBaseConsistency(ph.stated.value!, paco2.stated.value!, hco3.stated.value!);
      if (!result || result.consistent) return;
      ctx.report({
        range: toRange(hco3.stated.line, hco3.stated.item.value?.span ?? hco3.stated.item.span),
        message: `HCO3 ${formatNumber(hco3.stated.value!, 1)} mmol/L does not fit pH ${formatNumber(ph.stated.value!, 2)} and PaCO2 ${gasPressureText(paco2.stated.value!, 0, showsKpa(tp))}, which give ${formatNumber(result.calculatedHco3MmolL, 1)} mmol/L: a transcription error, or values from different samples?`,
      });
    }
  },
});
