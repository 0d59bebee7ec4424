/** A PaO2 above the alveolar PO2 that the stated FiO2 and pressure allow is impossible. */
import { describeInputOrigin } from '../derive/context';
import { ALVEOLAR_ROUNDING_MMHG, isAboveAlveolar, simplifiedFormAllowance } from '../derive/gas-exchange';
import { derivedValueOf } from '../derive/registry';
import { SOURCES } from '../physiology';
import { gasPressureText, showsKpa, statedGasText } from '../present';
import { toRange } from '../syntax/tree';
import type { Term } from '../derive/model';
import type { Range } from '../types';
import { formatNumber } from '../util/format';
import { defineCheck } from './check';

export const pao2AboveAlveolar = defineCheck({
  code: 'PN401',
  alias: 'pao2-above-alveolar',
  title: 'PaO2 above the alveolar PO2',
  severity: 'error',
  tags: ['physiology'],
  doc: {
    fires: `The arterial PO2 is more than ${ALVEOLAR_ROUNDING_MMHG} mmHg above the alveolar PO2 that the FiO2, barometric pressure and PaCO2 in force allow, by the full alveolar gas equation (where the simplified one is shown, the full one is higher on oxygen: by 10 mmHg on FiO2 1.0 with PaCO2 40, and the PaO2 is judged against it). Also, where no PaCO2 is used (none written, or one not used: see its finding), a PaO2 more than ${ALVEOLAR_ROUNDING_MMHG} mmHg above the inspired PO2, which the alveolar PO2 never exceeds whatever the PaCO2. Blood cannot hold a higher PO2 than the gas it meets, so something in the note is wrong. Nothing is computed from that PaO2 (A–a gradient, a/A ratio, P/F, oxygenation index, CaO2 and what follows from them): hints, hovers, \`show\` and exports say they are withheld, or leave their cells empty. No oxygenation or respiratory failure reading is given from it either.`,
    example: '@ 08:00\noxygen room air\nabg ph 7.40, pco2 40, po2 160',
    fix: 'Check the FiO2 in force (and where it came from), the unit of the PaO2 (kPa written as mmHg?), and an air bubble in the syringe, which pulls the sample\'s PO2 towards that of room air.',
  },
  source: SOURCES['alveolar-gas-equation'],
  runTimepoint(ctx) {
    const tp = ctx.timepoint;
    // Only a PaO2 stated here is compared (asked without building the value).
    if (tp.values.originOf('pao2') !== 'here') return;
    const alveolar = derivedValueOf(ctx.derivation, 'pao2_alveolar');
    // Without an alveolar PO2 (no usable PaCO2), the inspired PO2, which it never exceeds.
    const inspired = alveolar ? null : derivedValueOf(ctx.derivation, 'pio2');
    if (!alveolar && !inspired) return;
    const pao2 = tp.values.get('pao2');
    if (!pao2 || pao2.origin.kind !== 'here' || !pao2.stated.usable || pao2.stated.value === null) return;
    const fio2 = derivedValueOf(ctx.derivation, 'pio2')?.inputs.find((t) => t.name === 'FiO2');
    if (inspired) {
      if (!isAboveAlveolar(pao2.stated.value, inspired.value)) return;
      const kpa = showsKpa(tp);
      ctx.report({
        range: toRange(pao2.stated.line, pao2.stated.item.value?.span ?? pao2.stated.item.span),
        message: `PaO2 ${statedGasText(pao2.stated, kpa)} is above the inspired PO2 of ${gasPressureText(inspired.value, 0, kpa)} that ${fio2 ? `FiO2 ${formatNumber(fio2.value, 2)}` : 'the FiO2'} allows here, and the alveolar PO2 is lower still whatever the PaCO2: check the FiO2, the unit, and whether the sample had an air bubble.`,
        related: relatedFio2(fio2),
      });
      return;
    }
    if (!alveolar) return;
    // Judged against the full alveolar gas equation's PO2, the higher of the two forms on oxygen.
    const allowance = simplifiedFormAllowance(ctx.settings, fio2?.value ?? null, tp.values.numberOf('paco2'));
    if (!isAboveAlveolar(pao2.stated.value, alveolar.value, allowance)) return;
    const related = relatedFio2(fio2);
    const allowed = fio2 ? `FiO2 ${formatNumber(fio2.value, 2)}` : 'the FiO2';
    const kpa = showsKpa(tp);
    ctx.report({
      range: toRange(pao2.stated.line, pao2.stated.item.value?.span ?? pao2.stated.item.span),
      message: alveolar.value < 0
        // The alveolar gas equation gives less than nothing: the inputs contradict each other whatever the PaO2.
        ? `No PaO2 is possible here: with ${allowed}, the barometric pressure and the PaCO2 in force, the alveolar PO2 comes out at ${gasPressureText(alveolar.value, 0, kpa)}. Check the FiO2, the altitude or pressure, and the units of PaCO2 and PaO2.`
        // Where the full form's alveolar PO2, the one judged against, is further above the simplified one shown than rounding, both are named.
        : allowance >= ALVEOLAR_ROUNDING_MMHG
          ? `PaO2 ${statedGasText(pao2.stated, kpa)} is above the alveolar PO2 that ${allowed} allows here (${gasPressureText(alveolar.value, 0, kpa)} by the simplified alveolar gas equation, ${gasPressureText(alveolar.value + allowance, 0, kpa)} by the full one): check the FiO2, the unit, and whether the sample had an air bubble.`
          : `PaO2 ${statedGasText(pao2.stated, kpa)} is above the alveolar PO2 of ${gasPressureText(alveolar.value, 0, kpa)} that ${allowed} allows here: check the FiO2, the unit, and whether the sample had an air bubble.`,
      related,
    });
  },
});

/** The FiO2 the PaO2 is judged by, where the note states it, as related information. */
function relatedFio2(fio2: Term | undefined): { range: Range; message: string }[] {
  return fio2 && fio2.origin.kind !== 'default' && fio2.origin.kind !== 'derived'
    ? [{ range: toRange(fio2.origin.line, fio2.origin.span), message: `FiO2 ${formatNumber(fio2.value, 2)} in force (${describeInputOrigin(fio2.origin)})` }]
    : [];
}
