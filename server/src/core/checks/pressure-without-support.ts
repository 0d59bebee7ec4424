/**
 * A pressure of NIV or CPAP (an IPAP, an EPAP, a CPAP level) written on an oxygen line whose device
 * does not give it: a device that gives no set airway pressure (`oxygen mask, epap 6`), or the other
 * support (`oxygen cpap ipap 14, epap 6`: CPAP holds one pressure, its level; `oxygen niv level 8`:
 * bilevel support gives an IPAP and an EPAP); or, with no device named, a CPAP level beside an IPAP
 * or an EPAP (`oxygen epap 6, level 8`), which make the line NIV. The one rule (`noninvasiveSupport`) lets a named
 * device decide the support, so the pressure cannot be what the device gives: either the device is
 * another (NIV is often given through a face mask) or the pressure does not belong there. Until the
 * line says which, the pressure is not used (`givesPressure`: not as the end-expiratory pressure,
 * not compared with a peak or with the other pressure).
 */
import type { StatedValue } from '../analysis/model';
import { deviceWithoutPressure, nivPressureBesideLevel, supportOfDevice, supportOfPressure, type NoninvasiveSupport } from '../analysis/noninvasive-support';
import type { ItemNode, SectionLine } from '../syntax/tree';
import { itemsRemovalSpan, toRange } from '../syntax/tree';
import type { Fix, TextEdit } from '../types';
import { defineCheck, type TimepointContext } from './check';

export const pressureWithoutSupport = defineCheck({
  code: 'PN318',
  alias: 'pressure-without-support',
  title: 'NIV or CPAP pressure the device does not give',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: 'An oxygen line names a device and also writes a pressure of non-invasive support above 0 that the device does not give: an `ipap`, an `epap` or a CPAP `level` beside a device that gives no set airway pressure (room air, a cannula, a mask, a venturi or reservoir mask, high flow: `oxygen mask, epap 6`), an `ipap` or an `epap` beside `cpap`, which holds one pressure, its level (`oxygen cpap ipap 14, epap 6`), or a `level` beside `niv`, which gives an IPAP and an EPAP (`oxygen niv level 8`). With no device named, the pressures decide: an `ipap` or an `epap` makes the line NIV and a `level` alone CPAP, so a `level` beside an `ipap` or an `epap` (`oxygen epap 6, level 8`) is a pressure of the other support too, and is reported. A pressure of 0 is none, as any device gives. The named device decides what the line is, so either the device or the pressure is wrong. Until the line is mended the pressure is not used at that timepoint (nor where the line carries): not as the end-expiratory pressure of driving pressure, the compliances or the Berlin band reading (where a line writes both, the CPAP level under `cpap` and the EPAP under `niv`), and not compared with a peak (PN314) or the other pressure (PN315). The exports keep it as written. Once per pressure.',
    example: '@ 08:00\noxygen mask, epap 6, fio2 0.5\n@ 09:00\noxygen cpap ipap 14, epap 6, fio2 0.5',
    fix: 'NIV is often given through a face mask: if so, write `niv` as the device (`oxygen niv epap 6, fio2 0.5`), or `cpap` for a CPAP level (`oxygen cpap level 8`); if no such support is given, remove the pressure. An IPAP beside `cpap` is bilevel support: write `niv`; one level beside `niv` is continuous pressure: write `cpap`; an EPAP alone beside `cpap` is its level: write `level` for `epap`; beside the device\'s own pressure, remove the other. With no device, remove the level if NIV is given, or the IPAP and EPAP if CPAP is; naming the device says which. The quick fixes do each of these.',
  },
  source: 'only NIV and CPAP devices set an airway pressure, NIV an inspiratory and an expiratory one and CPAP one level; other oxygen devices set a flow or an FiO2 (common practice, no source)',
  runTimepoint(ctx) {
    // One pass over the values stated here, which builds nothing: also a line replaced by a later
    // oxygen line of the same timepoint is reported, though its values are not in force.
    const stated = ctx.timepoint.stated;
    for (let i = 0; i < stated.length; i++) {
      const s = stated[i]!;
      if (s.section !== 'oxygen' || supportOfPressure(s.fieldId) === null) continue;
      const device = deviceWithoutPressure(stated, s);
      const node = ctx.analysis.tree.lines[s.line];
      if (node?.kind !== 'section') continue;
      if (device === null) {
        // No device named: a CPAP level beside an IPAP or an EPAP, which make the line NIV.
        const niv = nivPressureBesideLevel(stated, s);
        if (niv !== null) ctx.report({ range: toRange(s.line, s.item.span), message: levelBesideNivMessage(node, s, niv), fixes: levelBesideNivFixes(node, s) });
        continue;
      }
      const deviceSupport = supportOfDevice(device.word);
      const mend = deviceSupport === null ? null : mendOf(stated, s, deviceSupport);
      ctx.report({ range: toRange(s.line, s.item.span), message: messageOf(node, s, device, mend), fixes: fixesOf(ctx, node, s, device, mend) });
    }
  },
});

/** How a message names each pressure, and what a fix removes. */
const PRESSURE_NAMES: Readonly<Record<string, { name: string; key: string }>> = {
  ipap: { name: 'IPAP', key: 'IPAP' },
  epap: { name: 'EPAP', key: 'EPAP' },
  cpap_level: { name: 'CPAP level', key: 'level' },
};

/** What each support gives, as a message says it. */
const SUPPORT_GIVES: Readonly<Record<NoninvasiveSupport, (name: string) => string>> = {
  cpap: (name) => `CPAP gives one pressure, its level, and no ${name}`,
  niv: () => 'NIV gives an IPAP and an EPAP, not one CPAP level',
};

/** The text of a span of a line. */
function textOf(node: SectionLine, span: { start: number; end: number }): string {
  return node.text.slice(span.start, span.end);
}

/**
 * How a line with a pressure its device (`niv` or `cpap`) does not give is mended, of the surely
 * right ways (common practice, no source):
 * - `device`: the line writes none of the device's own pressures, and the ones written are the
 *   other support's: an IPAP (`cpap ipap 14, epap 6`: the inspiratory pressure of bilevel support),
 *   or one level beside `niv` (continuous pressure). The other support's word as the device.
 * - `level`: an EPAP alone beside `cpap`: CPAP holds one pressure, which is its expiratory pressure
 *   too, so the EPAP is its level. The key `level` in place of `epap`.
 * - `remove`: the line writes the device's own pressure too (`cpap level 8, epap 6`): the other goes.
 */
type Mend = 'device' | 'level' | 'remove';

function mendOf(stated: readonly StatedValue[], pressure: StatedValue, device: NoninvasiveSupport): Mend {
  let own = false;
  let ipap = false;
  for (let i = 0; i < stated.length; i++) {
    const s = stated[i]!;
    if (s.line !== pressure.line || s.section !== 'oxygen' || s.value === 0) continue;
    const support = supportOfPressure(s.fieldId);
    if (support === device) own = true;
    else if (s.fieldId === 'ipap') ipap = true;
  }
  if (own) return 'remove';
  return device === 'cpap' && !ipap ? 'level' : 'device';
}

function messageOf(node: SectionLine, pressure: StatedValue, device: StatedValue, mend: Mend | null): string {
  const names = PRESSURE_NAMES[pressure.fieldId]!;
  const deviceText = device.item.value ? textOf(node, device.item.value.span) : device.word ?? '';
  // IPAP is no end-expiratory pressure: it is never taken as one.
  const unused = pressure.fieldId === 'ipap' ? `so the ${names.name} is not used` : `so the ${names.name} is not used (not as the end-expiratory pressure either)`;
  const deviceSupport = supportOfDevice(device.word);
  const gives = deviceSupport === null ? 'this device gives no set airway pressure' : SUPPORT_GIVES[deviceSupport](names.name);
  return `\`${textOf(node, pressure.item.span)}\` beside \`${deviceText}\`: ${gives}, ${unused}. ${adviceOf(pressure, names, deviceSupport, mend)}`;
}

function adviceOf(pressure: StatedValue, names: { name: string; key: string }, device: NoninvasiveSupport | null, mend: Mend | null): string {
  if (device === null) {
    return supportOfPressure(pressure.fieldId) === 'niv'
      ? `NIV is often given through a face mask: if so, write \`niv\` as the device; if not, remove the ${names.key}.`
      : `If CPAP is given, write \`cpap\` as the device; if not, remove the ${names.key}.`;
  }
  if (mend === 'remove') return `The line writes ${device === 'cpap' ? 'the CPAP level' : 'an IPAP or an EPAP'} too: remove the ${names.key}, or name the device that gives it.`;
  if (mend === 'level') return 'Under CPAP the one pressure is the level: write `level` for `epap`, or `niv` as the device if the support is bilevel.';
  return device === 'cpap'
    ? 'An IPAP and an EPAP are the pressures of bilevel support: if it is given, write `niv` as the device.'
    : 'One level is continuous pressure: if so, write `cpap` as the device.';
}

/**
 * The fixes, none safe unseen. Beside a device that gives no set airway pressure, two: the support's
 * word in place of the device word (its value, where the device is written with its key), and the
 * pressure removed with the separator before it (or, first on its line, the one after it). Beside
 * `niv` or `cpap`, the one way `mendOf` finds. A number right after the device is its flow, but after
 * `cpap` its level: naming CPAP keys such a flow (`cannula 2` → `cpap flow 2`); and after `venturi`
 * or `hfnc` maybe its FiO2, which any other device would read as a flow: naming the support keys it
 * (`venturi 0.4` → `niv fio2 0.4`, `hfnc 60 %` → `niv fio2 60 %`), and a second number after `hfnc` too. The device is not
 * renamed where the pressures, then used, would be out of order (PN314, PN315): each is a mistake
 * of its own, and the fix would give the note an error.
 */
function fixesOf(ctx: TimepointContext, node: SectionLine, pressure: StatedValue, device: StatedValue, mend: Mend | null): readonly Fix[] {
  const fixes: Fix[] = [];
  const support = supportOfPressure(pressure.fieldId)!;
  const word = device.item.value;
  const items = node.items;
  if (mend === 'level') {
    const key = pressure.item.key;
    if (key) fixes.push({ title: `Change \`${key.text}\` to \`level\``, edits: [{ range: toRange(pressure.line, key.span), newText: 'level' }] });
    return fixes;
  }
  if (word && (mend === null || mend === 'device') && inOrderOnceNamed(ctx, pressure.line)) {
    const edits: TextEdit[] = [{ range: toRange(device.line, word.span), newText: support }];
    // After another device the numbers are read again: after `cpap` the first would be the level,
    // only after `venturi` or `hfnc` is one an FiO2 (`venturi 0.4` → `niv fio2 0.4`), and only
    // after `hfnc` is there a second (`hfnc 60 % 40 L/min` → `niv fio2 60 % flow 40 L/min`). Each keeps its key.
    for (let k = items.indexOf(device.item) + 1, first = true; items[k]?.implied === 'device-flow'; k++, first = false) {
      const flow = items[k]!;
      if (support === 'cpap' || flow.keyName === 'fio2' || !first) edits.push({ range: toRange(device.line, { start: flow.span.start, end: flow.span.start }), newText: `${flow.keyName === 'fio2' ? 'fio2' : 'flow'} ` });
    }
    fixes.push({ title: `Change the device to \`${support}\``, edits });
  }
  const at = items.indexOf(pressure.item);
  if (at >= 0 && (mend === null || mend === 'remove')) {
    const span = pressure.item.span;
    const before = items[at - 1];
    const after = items[at + 1];
    const cut = before ? { start: before.span.end, end: span.end } : { start: span.start, end: after ? after.span.start : span.end };
    fixes.push({ title: `Remove \`${textOf(node, span)}\``, edits: [{ range: toRange(pressure.line, cut), newText: '' }] });
  }
  return fixes;
}

/**
 * A CPAP level beside an IPAP or an EPAP (`niv`, the first of them) on an oxygen line that names no
 * device: the line reads as NIV, which gives no CPAP level.
 */
function levelBesideNivMessage(node: SectionLine, level: StatedValue, niv: StatedValue): string {
  const others = nivItemsOf(node).length > 1 ? 'the IPAP and the EPAP' : `the ${PRESSURE_NAMES[niv.fieldId]!.name}`;
  return `\`${textOf(node, level.item.span)}\` beside \`${textOf(node, niv.item.span)}\`, with no device named: an IPAP or an EPAP makes the line NIV, which gives an IPAP and an EPAP, not one CPAP level, so the CPAP level is not used (not as the end-expiratory pressure either). If NIV is given, remove the level; if CPAP, remove ${others}. Naming the device (\`niv\` or \`cpap\`) says which.`;
}

/** The IPAP and EPAP items of a line. */
function nivItemsOf(node: SectionLine): ItemNode[] {
  const out: ItemNode[] = [];
  for (const item of node.items) if (item.field !== null && (item.field.id === 'ipap' || item.field.id === 'epap')) out.push(item);
  return out;
}

/**
 * Two fixes, neither safe unseen: the level removed (the line stays NIV), or the IPAP and EPAP
 * removed (the level makes it CPAP).
 */
function levelBesideNivFixes(node: SectionLine, level: StatedValue): readonly Fix[] {
  const niv = nivItemsOf(node);
  return [
    { title: `Remove \`${textOf(node, level.item.span)}\``, edits: removalEdits(node, [level.item]) },
    { title: `Remove ${niv.map((i) => `\`${textOf(node, i.span)}\``).join(' and ')}`, edits: removalEdits(node, niv) },
  ];
}

/**
 * The edits that remove `removed` (items of `node`), each run of neighbours as one, with the
 * separator before the run (or, first on its line, the one after it).
 */
function removalEdits(node: SectionLine, removed: readonly ItemNode[]): TextEdit[] {
  const items = node.items;
  const edits: TextEdit[] = [];
  let i = 0;
  while (i < items.length) {
    if (!removed.includes(items[i]!)) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < items.length && removed.includes(items[j + 1]!)) j++;
    edits.push({ range: toRange(node.line, itemsRemovalSpan(items, i, j)), newText: '' });
    i = j + 1;
  }
  return edits;
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
