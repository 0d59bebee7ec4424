/**
 * An oxygen flow written on a room-air line (`oxygen room air 2`): room air is breathing without
 * added oxygen, so a flow says oxygen is given through some device. Which one the note does not
 * say, so FiO2 is not taken as 0.21 there (see `DeriveContext.fio2`). Likewise an FiO2 above 0.21
 * written on a room-air line (`oxygen room air, fio2 0.4`, PN316): neither FiO2 is used there.
 */
import { toRange } from '../syntax/tree';
import { formatNumber, formatShort } from '../util/format';
import { flowOnRoomAir, isRoomAirContradiction } from '../derive/context';
import { defineCheck } from './check';

export const flowOnRoomAirCheck = defineCheck({
  code: 'PN310',
  alias: 'flow-on-room-air',
  title: 'Oxygen flow on room air',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: 'An oxygen line says room air and also gives an oxygen flow above zero (`oxygen room air 2`). Room air means no added oxygen, so one of the two is wrong; until the line is mended, FiO2 is not taken as 0.21 at that timepoint and the values that need it (P/F, A–a gradient) wait for it.',
    example: '@ 08:00\noxygen room air 2',
    fix: 'Name the device the oxygen goes through (`oxygen cannula 2`), or remove the flow if the patient breathes room air.',
  },
  source: 'room air is breathing without supplemental oxygen, so it has no oxygen flow (common practice, no source)',
  runTimepoint(ctx) {
    const values = ctx.timepoint.values;
    // Asked without building the values: a room-air line with an FiO2 states its device here (an
    // oxygen line replaces the one before it whole), and nearly every timepoint states none.
    if (values.originOf('device') !== 'here') return;
    // Reported where the oxygen line is written, not at every timepoint it carries to.
    if (values.originOf('o2_flow') !== 'here') return;
    const flow = flowOnRoomAir(values);
    const input = flow === null ? undefined : values.get('o2_flow');
    if (flow === null || !input) return;
    ctx.report({
      range: toRange(input.stated.line, input.stated.item.span),
      message: `Room air with an oxygen flow of ${formatShort(flow)} L/min: room air means no added oxygen. Name the device (e.g. \`oxygen cannula ${formatShort(flow)}\`) or remove the flow; FiO2 is not taken as 0.21 until then.`,
    });
  },
});

export const fio2OnRoomAirCheck = defineCheck({
  code: 'PN316',
  alias: 'fio2-on-room-air',
  title: 'FiO2 above 0.21 on room air',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: 'An oxygen line says room air and also gives an FiO2 above 0.21 (`oxygen room air, fio2 0.4`). Room air is an FiO2 of 0.21, so the device or the FiO2 is wrong. Until the line is mended neither is used at that timepoint (nor where the line carries): the FiO2 written would read a patient breathing air as on oxygen, and 0.21 would pass over an FiO2 that may be the true one; the values that need FiO2 (P/F, A–a gradient) wait. A sampling FiO2 on the gas line is used as usual.',
    example: '@ 08:00\noxygen room air, fio2 0.4',
    fix: 'Name the device that gives this FiO2 (`oxygen venturi, fio2 0.4`), or remove the FiO2 if the patient breathes room air.',
  },
  source: 'room air is breathing without supplemental oxygen, an FiO2 of 0.21 (common practice, no source)',
  runTimepoint(ctx) {
    const values = ctx.timepoint.values;
    // Asked without building the values: a room-air line with an FiO2 states its device here (an
    // oxygen line replaces the one before it whole), and nearly every timepoint states none.
    if (values.originOf('device') !== 'here') return;
    // Reported where the oxygen line is written, not at every timepoint it carries to; the oxygen
    // line's FiO2 is the setting held even where a sampling FiO2 on a gas line is in force instead.
    const fio2 = values.heldSetting('fio2');
    if (!fio2 || fio2.origin.kind !== 'here' || !isRoomAirContradiction(fio2, values)) return;
    ctx.report({
      range: toRange(fio2.stated.line, fio2.stated.item.span),
      message: `Room air with FiO2 ${formatNumber(fio2.stated.value ?? NaN, 2)}: room air is an FiO2 of 0.21. Name the device that gives this FiO2, or remove the FiO2; neither FiO2 is used until then.`,
    });
  },
});
