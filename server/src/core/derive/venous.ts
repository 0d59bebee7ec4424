/**
 * The venous gas reading: what a venous gas stated without an arterial one can and cannot say.
 * Its pH stands for the arterial pH within a few hundredths (read for acidaemia or alkalaemia);
 * its PCO2 only screens for arterial hypercapnia; its PO2 says nothing of arterial oxygenation.
 * Sources: `bloom-2014`, `kelly-2010`, `kelly-2005` (physiology/acid-base.ts).
 */
import { PH_NORMAL, VENOUS_PCO2_SCREEN_MMHG, VENOUS_PH_BELOW_ARTERIAL, acidBaseConsistency, arterialPhFromVenous, venousPco2Screen } from '../physiology';
import { sideOf } from '../physiology/numeric';
import { showsKpa } from '../present';
import { formatAgainst } from '../util/format';
import { NONE } from '../util/lists';
import type { DeriveContext } from './context';
import { GAS_KPA, GAS_MMHG } from './gas-words';
import type { Interpretation } from './model';

/** The PaCO2 (mmHg) the venous screen rules out, as the validation study defined hypercapnia (`kelly-2005`). */
const SCREENED_PACO2_MMHG = 50;
const PH_DECIMALS = 2;
/** How far (mmHg) a venous PCO2 can be from the arterial one: 95 % limits of agreement about ±20 mmHg (`bloom-2014`, `kelly-2010`). */
const PCO2_DISAGREEMENT_MMHG = 20;

const BASIS_PH: readonly string[] = ['ph_venous'];
const BASIS_PCO2: readonly string[] = ['pvco2'];
const BASIS_BOTH: readonly string[] = ['ph_venous', 'pvco2'];
const BASIS_GAS: readonly string[] = ['ph_venous', 'pvco2', 'hco3_venous'];

/** The venous gas line stated at this timepoint, or -1: its pH or PvCO2 stated here. */
function venousLine(c: DeriveContext): number {
  const stated = c.timepoint.stated;
  for (let i = 0; i < stated.length; i++) {
    const s = stated[i]!;
    if (s.section === 'vbg' && (s.fieldId === 'ph_venous' || s.fieldId === 'pvco2')) return s.line;
  }
  return -1;
}

/**
 * The reading of a venous gas stated at this timepoint (none without one). Called only where no
 * arterial gas is stated here: an arterial gas beside it is read instead, and says more.
 */
export function readVenous(c: DeriveContext): readonly Interpretation[] {
  const line = venousLine(c);
  if (line < 0) return NONE;
  const ph = c.statedHere('ph_venous') ? c.number('ph_venous') : null;
  const pco2 = c.statedHere('pvco2') ? c.number('pvco2') : null;
  const resolution = pco2 !== null ? c.writtenResolutionMmhg('pvco2') : 0;
  const gas = showsKpa(c.timepoint) ? GAS_KPA : GAS_MMHG;
  const hco3 = c.statedHere('hco3_venous') ? c.number('hco3_venous') : null;
  if (ph !== null && pco2 !== null && hco3 !== null && acidBaseConsistency(ph, pco2, hco3, resolution)?.consistent === false) {
    return [reading(BASIS_GAS, line, false, 'Venous gas not read: its pH, PvCO2 and HCO3 do not fit together (see PN402).')];
  }
  const parts: string[] = [];
  let notable = false;
  const arterial = ph !== null ? arterialPhFromVenous(ph) : null;
  if (ph !== null && arterial !== null) {
    const { low, high } = PH_NORMAL;
    const side = sideOf(arterial, low) < 0 ? -1 : sideOf(arterial, high) > 0 ? 1 : 0;
    const shown = `pH ${formatAgainst(ph, PH_DECIMALS, low - VENOUS_PH_BELOW_ARTERIAL, high - VENOUS_PH_BELOW_ARTERIAL)} (arterial about ${formatAgainst(arterial, PH_DECIMALS, low, high)})`;
    if (side < 0) parts.push(`${shown}: consistent with acidaemia, below ${low.toFixed(PH_DECIMALS)}`);
    else if (side > 0) parts.push(`${shown}: consistent with alkalaemia, above ${high.toFixed(PH_DECIMALS)}`);
    else parts.push(`${shown}: within ${low.toFixed(PH_DECIMALS)}–${high.toFixed(PH_DECIMALS)}`);
    notable ||= side !== 0;
  }
  const screen = pco2 !== null ? venousPco2Screen(pco2, resolution) : null;
  if (pco2 !== null && screen !== null) {
    const shown = `PvCO2 ${gas.measured(pco2, resolution, VENOUS_PCO2_SCREEN_MMHG)}`;
    const at = sideOf(pco2, VENOUS_PCO2_SCREEN_MMHG, resolution) === 0 ? gas.on(VENOUS_PCO2_SCREEN_MMHG, resolution) : gas.threshold(VENOUS_PCO2_SCREEN_MMHG, pco2);
    if (screen === 'hypercapnia-not-excluded') {
      parts.push(`${shown}, above ${at}: consistent with arterial hypercapnia, not proof of it (a venous PCO2 can differ from the arterial one by ${gas.threshold(PCO2_DISAGREEMENT_MMHG)} either way; an arterial gas measures it)`);
      notable = true;
    } else parts.push(`${shown}, not above ${at}: consistent with no arterial hypercapnia (PaCO2 not above ${gas.threshold(SCREENED_PACO2_MMHG)})`);
  }
  if (parts.length === 0) return NONE;
  if (c.statedHere('pvo2')) parts.push('PvO2 says nothing of arterial oxygenation: SpO2 or an arterial gas shows it');
  const basis = ph !== null && pco2 !== null ? BASIS_BOTH : ph !== null ? BASIS_PH : BASIS_PCO2;
  return [reading(basis, line, notable, `Venous gas: ${parts.join('; ')}.`)];
}

function reading(basis: readonly string[], line: number, notable: boolean, text: string): Interpretation {
  return Object.freeze({ topic: 'venous', text, basis, line, notable, acidBase: null });
}
