/**
 * An FiO2 above what a Venturi mask gives, on a line naming one (`oxygen venturi 0.8`) or on a later
 * line that updates one in force (`oxygen fio2 0.8` after `oxygen venturi 28`): its settings
 * give 24 to 60 % oxygen, so the device or the FiO2 is wrong. The FiO2 is used as written (it is a
 * possible FiO2, only not from this device): the warning asks which was meant.
 */
import { toRange } from '../syntax/tree';
import { formatNumber } from '../util/format';
import { VENTURI_PERCENT } from '../syntax/parser';
import { defineCheck } from './check';

/** The highest FiO2 (a fraction) a Venturi setting gives. */
const VENTURI_MAX_FIO2 = VENTURI_PERCENT.max / 100;

export const venturiFio2High = defineCheck({
  code: 'PN322',
  alias: 'venturi-fio2-high',
  title: 'FiO2 above what a Venturi mask gives',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: `An oxygen line names a Venturi mask and gives an FiO2 above ${VENTURI_PERCENT.max} % (${formatNumber(VENTURI_MAX_FIO2, 2)}), the highest of the Venturi settings (${VENTURI_PERCENT.min} to ${VENTURI_PERCENT.max} %): \`oxygen venturi 0.8\`, \`oxygen venturi, fio2 90 %\`; or a later oxygen line that names no device gives one to a Venturi mask in force (\`oxygen fio2 0.8\` after \`oxygen venturi 28\`, which updates the mask). The FiO2 is a possible one, but not from this device, so either the device or the FiO2 is wrong. The FiO2 is used as written meanwhile (P/F, A–a gradient). Reported where the oxygen line is written, not at every timepoint it carries to.`,
    example: '@ 08:00\noxygen venturi 0.8',
    fix: 'Name the device that gives this FiO2 (a reservoir mask, high flow, NIV), or write the Venturi setting that was given.',
  },
  source: "European Respiratory Society, European Lung White Book, Principles of respiratory therapy, figure 2: Venturi masks set the inspired oxygen concentration, colour-coded from 24 to 60 %. O'Driscoll BR, Howard LS, Earis J, Mak V, on behalf of the British Thoracic Society Emergency Oxygen Guideline Group. BTS guideline for oxygen use in adults in healthcare and emergency settings. Thorax 2017;72(Suppl 1):ii1–ii90 (the citation read in its entry in the National Guideline Clearinghouse summary 11253; a 28 % Venturi mask at 4 L/min read in its reproduction in table 1 of a Breathe review, adapted from tables 1–4 of the 2008 BTS guideline, at breathe.ersjournals.com; the settings 24, 28, 31, 35, 40 and 60 % oxygen, at oxygen flows from 2 to 15 L/min, read in a teaching table of Venturi colour codes at md3.info/skills/oxygen/amplified, not in the guideline itself)",
  runTimepoint(ctx) {
    const values = ctx.timepoint.values;
    // Asked without building the values: nearly every timepoint states no FiO2.
    if (values.originOf('fio2') !== 'here') return;
    const device = values.get('device');
    if (!device || device.stated.word !== 'venturi') return;
    const fio2 = values.heldSetting('fio2');
    if (!fio2 || fio2.origin.kind !== 'here') return;
    // Written on the device's line, or on a later line that names no device and updates the mask
    // carried here (the one way a `fio2` held here sits beside a carried device).
    if (device.origin.kind === 'here' ? fio2.stated.line !== device.stated.line : device.origin.kind !== 'carried') return;
    const value = fio2.stated.value;
    if (value === null || !fio2.stated.usable || !(value > VENTURI_MAX_FIO2 + 1e-9)) return;
    ctx.report({
      range: toRange(fio2.stated.line, fio2.stated.item.span),
      message: `FiO2 ${formatNumber(value, 2)} from a Venturi mask, whose settings give ${VENTURI_PERCENT.min} to ${VENTURI_PERCENT.max} % oxygen (up to ${formatNumber(VENTURI_MAX_FIO2, 2)}): name the device that gives this FiO2 (a reservoir mask, high flow, NIV), or write the Venturi setting given. The FiO2 is used as written meanwhile.`,
    });
  },
});
