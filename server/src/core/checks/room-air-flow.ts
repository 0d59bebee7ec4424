/**
 * An oxygen flow written on a room-air line (`oxygen room air 2`): room air is breathing without
 * added oxygen, so a flow says oxygen is given through some device. Which one the note does not
 * say, so FiO2 is not taken as 0.21 there (see `DeriveContext.fio2`).
 */
import { toRange } from '../syntax/tree';
import { formatShort } from '../util/format';
import { flowOnRoomAir } from '../derive/context';
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
