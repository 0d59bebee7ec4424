/**
 * `pneumark show`: the note as the core understood it — each timepoint, its lines with
 * normalised values and units, values carried in from earlier timepoints, derived values and,
 * at an arterial gas, the change since the previous one, and findings under the line they belong to; then a legend of the short names and marks used above (see
 * render-legend.ts). Text from the note (the path, labels, prose, words, origins
 * and messages that quote the note) has its control characters made visible (see `visible`), so
 * that the only escape sequences written are the colours of `Paint`.
 */
import { SPO2_TARGET_FIELD, targetInForce, targetText } from '../core/analysis/spo2-target';
import type { NoteResult } from '../core/check-note';
import type { StatedValue, Timepoint } from '../core/analysis/model';
import { shortOf, formatAlternative, formatStated, describeOrigin, headerShowsKpa, showsKpa, statedInKpa } from '../core/present';
import { fieldById } from '../core/fields/registry';
import { unitById } from '../core/fields/units';
import { displayUnit, inLikelyUnit } from '../core/analysis/read-value';
import type { LineNode } from '../core/syntax/tree';
import type { TimepointDerivation } from '../core/derive/model';
import type { Finding } from '../core/types';
import { CHECKS } from '../core/checks/registry';
import type { Paint } from './colour';
import { renderDerived } from './render-derived';
import { gasAsReadingsShowIt } from '../core/derive/interpret';
import type { Settings } from '../core/settings';
import { Legend } from './render-legend';
import { changeSincePreviousGas, type GasChange } from '../core/gas-change';
import { visible } from './visible';

const READING_CODES = new Set(CHECKS.filter((c) => c.tags.includes('interpretation')).map((c) => c.code));

export function renderShow(path: string, result: NoteResult, p: Paint): string {
  const { analysis, findings } = result;
  const out: string[] = [];
  const byLine = new Map<number, Finding[]>();
  for (const f of findings) {
    // Readings are printed once, under their timepoint; only the other findings go under lines.
    if (READING_CODES.has(f.code)) continue;
    const list = byLine.get(f.range.start.line);
    if (list) list.push(f);
    else byLine.set(f.range.start.line, [f]);
  }
  const legend = new Legend();
  const counts = countSeverities(findings);
  out.push(`${p.bold(visible(path))}  ${p.dim(`${analysis.timeline.timepoints.length} timepoint${analysis.timeline.timepoints.length === 1 ? '' : 's'}`)}  ${summary(counts, p)}`);

  const statedByLine = new Map<number, StatedValue[]>();
  for (const s of [...analysis.timeline.header, ...analysis.timeline.timepoints.flatMap((t) => t.stated)]) {
    const list = statedByLine.get(s.line);
    if (list) list.push(s);
    else statedByLine.set(s.line, [s]);
  }
  const tpByStart = new Map<number, Timepoint>();
  for (const tp of analysis.timeline.timepoints) tpByStart.set(tp.line ?? tp.startLine, tp);
  const tpByEnd = new Map<number, Timepoint>();
  for (const tp of analysis.timeline.timepoints) tpByEnd.set(tp.endLine, tp);

  const headerLines = new Set(analysis.timeline.header.map((s) => s.line));
  let printedHeader = false;
  /** The timepoint the line belongs to (null in the header): its gas unit decides how gas pressures are shown, the header's on header lines. */
  let current: Timepoint | null = null;
  for (const node of analysis.tree.lines) {
    const tp = tpByStart.get(node.line);
    if (tp) current = tp;
    if (tp && tp.line === null) {
      out.push('', p.bold(p.cyan('@ (start)')));
      legend.mark('start');
    }
    if (node.kind === 'timepoint') {
      out.push('', `${p.bold(p.cyan(`@ ${visible(node.time?.text ?? '?')}`))}${node.label ? `  ${visible(node.label.text)}` : ''}  ${p.dim(`line ${node.line + 1}`)}`);
    } else if (node.kind === 'section') {
      if (!printedHeader && analysis.timeline.timepoints.every((t) => t.startLine > node.line)) {
        out.push('', p.bold('header'));
        printedHeader = true;
      }
      const kpa = headerLines.has(node.line) ? headerShowsKpa(analysis.timeline) : showsKpa(current);
      // The PaCO2 expected for a metabolic disorder at this timepoint, which a PaCO2 in kPa keeps its side of.
      const expected = kpa && current !== null && (statedByLine.get(node.line) ?? []).some((s) => s.fieldId === 'paco2') ? analysis.derivation(current.index)?.derived.find((d) => d.id === 'paco2_expected')?.range ?? null : null;
      out.push(renderSectionLine(node, statedByLine.get(node.line) ?? [], kpa, result.settings, p, legend, expected));
    } else if (node.kind === 'unknown') {
      out.push(`  ${p.red('?')} ${visible(node.text.trim())}`);
      legend.mark('unreadable-line');
    }
    for (const f of byLine.get(node.line) ?? []) {
      out.push(renderFinding(f, p));
      legend.mark('finding');
    }
    const ending = tpByEnd.get(node.line);
    if (ending) out.push(...renderTimepointFooter(ending, analysis.derivation(ending.index), result.settings, p, legend, changeSincePreviousGas(result, ending.index)));
  }
  out.push(...legend.lines(p));
  return out.join('\n');
}

/**
 * A section line's values; where the gas unit in force is kPa (`kpa`), gas pressures in kPa first:
 * `PaCO2 9.6 kPa (72 mmHg)`, a PaO2 or PaCO2 with the decimals that keep it on its side of the
 * thresholds the readings name (`gasAsReadingsShowIt`): `PaO2 7.99 kPa (59.9 mmHg)` beside "below 8.0 kPa".
 */
function renderSectionLine(node: Extract<LineNode, { kind: 'section' }>, stated: readonly StatedValue[], kpa: boolean, settings: Settings, p: Paint, legend: Legend, expected: { readonly low: number; readonly high: number } | null = null): string {
  const head = `  ${p.blue(visible(node.section).padEnd(8))}`;
  if (node.section === 'note') return `${head} ${p.dim(visible(node.prose?.text ?? ''))}`;
  const parts = stated.map((s) => {
    const inKpa = kpa && !s.unitDoubt ? statedInKpa(s) : null;
    const asRead = inKpa ? gasAsReadingsShowIt(s, settings, s.fieldId === 'paco2' ? expected : null) : null;
    // A bare number whose unit is in doubt is shown as written, with what it would be if it was
    // written in the likely unit (never a conversion from the unit it is doubted in).
    const alt = asRead ? `${asRead.mmHg} mmHg` : inKpa ? formatStated(s) : s.unitDoubt ? ifLikelyUnit(s) : s.unit !== 'fraction' ? formatAlternative(s) : null;
    const value = asRead ? `${asRead.kpa} kPa` : inKpa ?? (s.unitDoubt ? `${s.item.value?.text ?? ''} ?` : formatStated(s));
    if (s.unitDoubt) legend.mark('unit-doubt');
    if (!s.usable) legend.mark('not-used');
    // A value its field holds as a setting, read here as a measurement of this timepoint (a tidal
    // volume under a mode that sets a pressure, or on a vent line of readings under NIV): not carried.
    const measured = node.section === 'vent' && s.usable && s.hereOnly && s.field.reading !== true;
    if (measured) legend.mark('measured');
    const flag = s.usable ? (measured ? p.dim(' (measured)') : '') : p.yellow(' (not used)');
    return `${shortOf(s.fieldId)} ${p.bold(visible(value))}${alt ? p.dim(` (${visible(alt)})`) : ''}${flag}`;
  });
  return `${head} ${parts.join(p.dim(' · '))}`;
}

/**
 * For a bare number read in one unit where another is likely (PN204): the number taken in the
 * likely unit, in the unit the note reads bare numbers in, as PN204's conversion fix writes it —
 * `if kPa: 40 mmHg` for a PaCO2 of 5.3 read in mmHg. Null when there is no such number.
 */
export function ifLikelyUnit(s: StatedValue): string | null {
  const field = fieldById(s.fieldId);
  const likely = unitById(s.unitDoubt ?? '');
  const read = unitById(s.readUnit ?? '');
  const written = s.item.number;
  if (!field || !likely || !read || written === null) return null;
  const inRead = inLikelyUnit(field, written, likely, read);
  if (inRead === null) return null;
  const unit = read.id === 'fraction' || read.id === 'ph' ? '' : ` ${displayUnit(read.id)}`;
  return `if ${displayUnit(likely.id)}: ${inRead}${unit}`;
}

function renderTimepointFooter(tp: Timepoint, derivation: TimepointDerivation | undefined, settings: Settings, p: Paint, legend: Legend, change: GasChange | null): string[] {
  const carried = [...tp.values.values()].filter((v) => v.origin.kind === 'carried');
  const lines: string[] = [];
  const groups = new Map<string, string[]>();
  for (const v of carried) {
    const from = visible(describeOrigin(v.origin));
    const list = groups.get(from) ?? [];
    const inKpa = showsKpa(tp) ? statedInKpa(v.stated) : null;
    const asRead = inKpa ? gasAsReadingsShowIt(v.stated, settings) : null;
    // Marked as on the line it was stated on: a value not used there is not used where it carries to.
    if (!v.stated.usable) legend.mark('not-used');
    const flag = v.stated.usable ? '' : p.yellow(' (not used)');
    list.push(`${shortOf(v.stated.fieldId)} ${visible(asRead ? `${asRead.kpa} kPa (${asRead.mmHg} mmHg)` : inKpa ? `${inKpa} (${formatStated(v.stated)})` : formatStated(v.stated))}${flag}`);
    groups.set(from, list);
  }
  for (const [from, values] of groups) lines.push(`  ${p.magenta('carried'.padEnd(8))} ${values.join(p.dim(' · '))} ${p.dim(`(${from})`)}`);
  // The setting's target, where the note writes none: the one written shows as any value does.
  const target = tp.values.originOf(SPO2_TARGET_FIELD) === null ? targetInForce(tp.values, settings) : null;
  if (target !== null) lines.push(`  ${p.magenta('target'.padEnd(8))} ${shortOf(SPO2_TARGET_FIELD)} ${targetText(target)} ${p.dim('(spo2Target setting)')}`);
  lines.push(...renderDerived(tp, derivation, p, legend, change));
  return lines;
}

export function renderFinding(f: Finding, p: Paint): string {
  const mark = f.severity === 'error' ? p.red('✖ error') : f.severity === 'warning' ? p.yellow('▲ warning') : p.blue('● info');
  return `      ${mark} ${p.dim(f.code)} ${visible(f.message)} ${p.dim(`(${f.range.start.line + 1}:${f.range.start.character + 1})`)}`;
}

export interface SeverityCounts {
  error: number;
  warning: number;
  information: number;
  hint: number;
}

/** The findings by severity, added to `into` when given (totals over several notes). */
export function countSeverities(findings: readonly Finding[], into: SeverityCounts = { error: 0, warning: 0, information: 0, hint: 0 }): SeverityCounts {
  for (const f of findings) into[f.severity]++;
  return into;
}

function summary(c: SeverityCounts, p: Paint): string {
  const parts: string[] = [];
  if (c.error) parts.push(p.red(`${c.error} error${c.error === 1 ? '' : 's'}`));
  if (c.warning) parts.push(p.yellow(`${c.warning} warning${c.warning === 1 ? '' : 's'}`));
  // As `check` counts them: information findings are the notable readings and any other finding
  // at information level, never every reading line printed below.
  if (c.information) parts.push(p.blue(`${c.information} info`));
  return parts.length > 0 ? parts.join(', ') : p.green('no findings');
}
