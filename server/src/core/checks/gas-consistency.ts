/** pH, PCO2 and HCO3 of one gas, arterial or venous, must agree (Henderson–Hasselbalch). */
import { acidBaseConsistency, HCO3_CONSISTENCY_TOLERANCE, SOURCES } from '../physiology';
import { kpaResolutionMmhg, showsKpa, statedGasText } from '../present';
import { toRange } from '../syntax/tree';
import { formatNumber } from '../util/format';
import { defineCheck, type TimepointContext } from './check';

export const gasInconsistent = defineCheck({
  code: 'PN402',
  alias: 'gas-inconsistent',
  title: 'pH, PaCO2 and HCO3 disagree',
  severity: 'warning',
  tags: ['physiology'],
  doc: {
    fires: `The reported HCO3 differs from the HCO3 that the reported pH and PaCO2 give by Henderson–Hasselbalch by more than max(${HCO3_CONSISTENCY_TOLERANCE.absoluteMmolL} mmol/L, ${HCO3_CONSISTENCY_TOLERANCE.relative * 100} %), for every PaCO2 a value written in kPa stands for (5.3 kPa: 5.25–5.35 kPa), so that a gas in kPa fires as its mmHg twin does. A venous gas is checked the same way, its HCO3 against its own pH and PvCO2 (never against an arterial gas beside it). An analyser calculates HCO3 from pH and PaCO2, so a disagreement points to a transcription error or values from different samples.`,
    example: '@ 08:00\nabg 7.40/40/90/15',
    fix: 'Check the three values against the analyser print-out; the hover shows the HCO3 the pH and PaCO2 imply.',
  },
  source: `${SOURCES['henderson-hasselbalch']} ${SOURCES['pneumark-consistency-tolerance']}`,
  runTimepoint(ctx) {
    checkGas(ctx, ARTERIAL);
    checkGas(ctx, VENOUS);
  },
});

/** The fields of one kind of gas, and how a message names its pH and PCO2. */
interface GasFields {
  readonly ph: string;
  readonly pco2: string;
  readonly hco3: string;
  /** Before the pH in a message: '' for an arterial gas, 'the venous ' for a venous one. */
  readonly phWords: string;
  readonly pco2Name: string;
}

const ARTERIAL: GasFields = { ph: 'ph', pco2: 'paco2', hco3: 'hco3', phWords: '', pco2Name: 'PaCO2' };
/** A venous gas obeys the same equation: its HCO3 is calculated from its own pH and PvCO2. */
const VENOUS: GasFields = { ph: 'ph_venous', pco2: 'pvco2', hco3: 'hco3_venous', phWords: 'the venous ', pco2Name: 'PvCO2' };

function checkGas(ctx: TimepointContext, gas: GasFields): void {
  const tp = ctx.timepoint;
  // Only an HCO3 stated here is checked (asked without building the value).
  if (tp.values.originOf(gas.hco3) !== 'here') return;
  // The usable numbers in force, read without building the values; the HCO3's value is built
  // only for a finding's range.
  const ph = tp.values.numberOf(gas.ph);
  const pco2 = tp.values.numberOf(gas.pco2);
  const hco3 = tp.values.numberOf(gas.hco3);
  if (ph === null || pco2 === null || hco3 === null) return;
  let result = acidBaseConsistency(ph, pco2, hco3);
  if (!result || result.consistent) return;
  // A PCO2 written in kPa is compared at the resolution it was written with, as its mmHg twin would be.
  const pco2Stated = tp.values.get(gas.pco2)!.stated;
  const resolution = kpaResolutionMmhg(pco2Stated);
  if (resolution > 0) result = acidBaseConsistency(ph, pco2, hco3, resolution);
  if (!result || result.consistent) return;
  const stated = tp.values.get(gas.hco3)!.stated;
  ctx.report({
    range: toRange(stated.line, stated.item.value?.span ?? stated.item.span),
    message: `HCO3 ${formatNumber(hco3, 1)} mmol/L does not fit ${gas.phWords}pH ${formatNumber(ph, 2)} and ${gas.pco2Name} ${statedGasText(pco2Stated, showsKpa(tp))}, which give ${formatNumber(result.calculatedHco3MmolL, 1)} mmol/L: a transcription error, or values from different samples?`,
  });
}
