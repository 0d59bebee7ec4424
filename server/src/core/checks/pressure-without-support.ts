/**
 * A pressure of NIV or CPAP (an IPAP, an EPAP, a CPAP level) written on an oxygen line whose device
 * gives no set airway pressure (`oxygen mask, epap 6`). The one rule (`noninvasiveSupport`) reads
 * such a line as neither NIV nor CPAP, so the pressure cannot be what the device gives: either the
 * device is another (NIV is often given through a face mask) or the pressure does not belong there.
 * Until the line says which, the pressure is not used (`givesNoSetPressure`: not as the
 * end-expiratory pressure, not compared with a peak or with the other pressure).
 */
import type { StatedValue } from '../analysis/model';
import { deviceWithoutPressure, supportOfPressure } from '../analysis/noninvasive-support';
import type { SectionLine } from '../syntax/tree';
import { toRange } from '../syntax/tree';
import type { Fix, TextEdit } from '../types';
import { defineCheck, type TimepointContext } from './check';

export const pressureWithoutSupport = defineCheck({
  code: 'PN318',
  alias: 'pressure-without-support',
  title: 'NIV or CPAP pressure beside a device that gives none',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: 'An oxygen line names a device that gives no set airway pressure (room air, a cannula, a mask, a venturi or reservoir mask, high flow) and also writes a pressure of non-invasive support above 0: an `ipap`, an `epap` or a CPAP `level` (`oxygen mask, epap 6`; a pressure of 0 is none, as the device gives). Such a line is neither NIV nor CPAP, so either the device or the pressure is wrong. Until the line is mended the pressure is not used at that timepoint (nor where the line carries): not as the end-expiratory pressure of driving pressure, the compliances or the Berlin band reading, and not compared with a peak (PN314) or the other pressure (PN315). The exports keep it as written. Once per pressure.',
    example: '@ 08:00\noxygen mask, epap 6, fio2 0.5',
    fix: 'NIV is often given through a face mask: if so, write `niv` as the device (`oxygen niv epap 6, fio2 0.5`), or `cpap` for a CPAP level (`oxygen cpap level 8`). If no such support is given, remove the pressure. The quick fixes do either.',
  },
  source: 'only NIV and CPAP devices set an airway pressure; other oxygen devices set a flow or an FiO2 (common practice, no source)',
  runTimepoint(ctx) {
    // One pass over the values stated here, which builds nothing: also a line replaced by a later
    // oxygen line of the same timepoint is reported, though its values are not in force.
    const stated = ctx.timepoint.stated;
    for (let i = 0; i < stated.length; i++) {
      const s = stated[i]!;
      if (s.section !== 'oxygen' || supportOfPressure(s.fieldId) === null) continue;
      const device = deviceWithoutPressure(stated, s);
      const node = ctx.analysis.tree.lines[s.line];
      if (device === null || node?.kind !== 'section') continue;
      ctx.report({ range: toRange(s.line, s.item.span), message: messageOf(node, s, device), fixes: fixesOf(ctx, node, s, device) });
    }
  },
});

/** How a message names each pressure, and what a fix removes. */
const PRESSURE_NAMES: Readonly<Record<string, { name: string; key: string }>> = {
  ipap: { name: 'IPAP', key: 'IPAP' },
  epap: { name: 'EPAP', key: 'EPAP' },
  cpap_level: { name: 'CPAP level', key: 'level' },
};

/** The text of a span of a line. */
function textOf(node: SectionLine, span: { start: number; end: number }): string {
  return node.text.slice(span.start, span.end);
}

function messageOf(node: SectionLine, pressure: StatedValue, device: StatedValue): string {
  const names = PRESSURE_NAMES[pressure.fieldId]!;
  const deviceText = device.item.value ? textOf(node, device.item.value.span) : device.word ?? '';
  // IPAP is no end-expiratory pressure: it is never taken as one.
  const unused = pressure.fieldId === 'ipap' ? `so the ${names.name} is not used` : `so the ${names.name} is not used (not as the end-expiratory pressure either)`;
  const advice = supportOfPressure(pressure.fieldId) === 'niv'
    ? `NIV is often given through a face mask: if so, write \`niv\` as the device; if not, remove the ${names.key}.`
    : `If CPAP is given, write \`cpap\` as the device; if not, remove the ${names.key}.`;
  return `\`${textOf(node, pressure.item.span)}\` beside \`${deviceText}\`: this device gives no set airway pressure, ${unused}. ${advice}`;
}

/**
 * Two fixes, neither safe unseen: the support's word in place of the device word (its value, where
 * the device is written with its key), and the pressure removed with the separator before it (or,
 * first on its line, the one after it). A number right after the device is its flow, but after
 * `cpap` its level: naming CPAP keys such a flow (`cannula 2` → `cpap flow 2`). The device is not
 * renamed where the pressures, then used, would be out of order (PN314, PN315): each is a mistake
 * of its own, and the fix would give the note an error.
 */
function fixesOf(ctx: TimepointContext, node: SectionLine, pressure: StatedValue, device: StatedValue): readonly Fix[] {
  const fixes: Fix[] = [];
  const support = supportOfPressure(pressure.fieldId)!;
  const word = device.item.value;
  const items = node.items;
  if (word && inOrderOnceNamed(ctx, pressure.line)) {
    const edits: TextEdit[] = [{ range: toRange(device.line, word.span), newText: support }];
    const flow = items[items.indexOf(device.item) + 1];
    if (support === 'cpap' && flow?.implied === 'device-flow') edits.push({ range: toRange(device.line, { start: flow.span.start, end: flow.span.start }), newText: 'flow ' });
    fixes.push({ title: `Change the device to \`${support}\``, edits });
  }
  const at = items.indexOf(pressure.item);
  if (at >= 0) {
    const span = pressure.item.span;
    const before = items[at - 1];
    const after = items[at + 1];
    const cut = before ? { start: before.span.end, end: span.end } : { start: span.start, end: after ? after.span.start : span.end };
    fixes.push({ title: `Remove \`${textOf(node, span)}\``, edits: [{ range: toRange(pressure.line, cut), newText: '' }] });
  }
  return fixes;
}

/**
 * Whether the pressures written on the oxygen line `line` are in order with each other and with the
 * peak in force, as PN315 and PN314 would compare them once the line names its support: the EPAP at
 * or below the IPAP, and the EPAP or the level at or below a peak where neither a PEEP nor a plateau
 * is in force.
 */
function inOrderOnceNamed(ctx: TimepointContext, line: number): boolean {
  const values = ctx.timepoint.values;
  const peak = values.numberOf('plateau') === null && values.numberOf('peep') === null ? values.numberOf('peak') : null;
  const stated = ctx.timepoint.stated;
  let ipap: number | null = null;
  let epap: number | null = null;
  let level: number | null = null;
  for (let i = 0; i < stated.length; i++) {
    const s = stated[i]!;
    if (s.line !== line || !s.usable || s.value === null) continue;
    if (s.fieldId === 'ipap') ipap = s.value;
    else if (s.fieldId === 'epap') epap = s.value;
    else if (s.fieldId === 'cpap_level') level = s.value;
  }
  if (epap !== null && ipap !== null && epap > ipap) return false;
  const endExpiratory = epap ?? level;
  return peak === null || endExpiratory === null || endExpiratory <= peak;
}
