// What a user sees of an analysis, as plain data, for comparing an editing session with a fresh
// analysis: findings (ranges, messages, fixes), every timepoint's values in force with their
// origins (also through the readers that build nothing), derived values, what is missing,
// readings, inlay hints, symbols, folding ranges and the trend view's points.
import type { NoteResult } from '../../server/src/core/check-note';
import { FIELDS } from '../../server/src/core/fields/registry';
import { trendGasUnit, trendPoints } from '../../server/src/core/trends';
import { inlayHints } from '../../server/src/core/service/hints';
import { documentSymbols, foldingRanges } from '../../server/src/core/service/symbols';
import { HINT_CATEGORIES } from '../../server/src/core/service/types';
import type { Origin, StatedValue } from '../../server/src/core/analysis/model';
import type { ReadIssue } from '../../server/src/core/analysis/read-issues';
import type { DerivedValue, InputOrigin, Term } from '../../server/src/core/derive/model';
import type { LineFix, Span } from '../../server/src/core/syntax/tree';

/**
 * A span as its two numbers. The parser's nodes are their own spans and keep their whole line, so
 * a span written out as it is would repeat the line once per item (quadratic on a line of many).
 */
function span(s: Span): Span {
  return { start: s.start, end: s.end };
}

function origin(o: Origin | InputOrigin): unknown {
  return 'span' in o ? { ...o, span: span(o.span) } : o;
}

function lineFix(f: LineFix): unknown {
  return { ...f, edits: f.edits.map((e) => ({ ...e, span: span(e.span) })) };
}

function readIssue(i: ReadIssue): unknown {
  return { check: i.check, line: i.line, span: span(i.span), message: i.message, fixes: i.fixes.map(lineFix), related: i.related?.map((r) => ({ line: r.line, span: span(r.span), message: r.message })) };
}

function term(t: Term): unknown {
  return { ...t, origin: origin(t.origin) };
}

function stated(s: StatedValue): unknown {
  return {
    fieldId: s.fieldId, section: s.section, line: s.line, value: s.value, parts: s.parts, word: s.word, unit: s.unit,
    readUnit: s.readUnit, unitImplied: s.unitImplied, unitDoubt: s.unitDoubt, usable: s.usable,
    item: { span: span(s.item.span), keyName: s.item.keyName, implied: s.item.implied, field: s.item.field?.id ?? null, valueKind: s.item.valueKind, number: s.item.number, unitText: s.item.unitText },
  };
}

function derived(d: DerivedValue): unknown {
  return {
    id: d.id, label: d.label, short: d.short, category: d.category, value: d.value, unit: d.unit, decimals: d.decimals,
    range: d.range, formula: d.formula, substituted: d.substituted, template: d.template, inputs: d.inputs.map(term), source: d.source,
    estimate: d.estimate, notes: d.notes, caveat: d.caveat, usesCarried: d.usesCarried, line: d.line,
  };
}

const FIELD_IDS = FIELDS.map((f) => f.id);
const WHOLE_NOTE = { start: 0, end: Number.MAX_SAFE_INTEGER };
const ALL_HINTS = { categories: new Set(HINT_CATEGORIES) };

/** Everything a user sees of an analysis, as plain data. */
export function snapshot(r: NoteResult): unknown {
  const { timeline } = r.analysis;
  return {
    settings: r.settings,
    lines: r.analysis.tree.lines.length,
    eol: r.analysis.tree.eol,
    findings: r.findings,
    header: timeline.header.map(stated),
    headerGasUnit: timeline.headerGasUnit,
    headerAgeYears: timeline.headerAgeYears,
    readIssues: timeline.readIssues.map(readIssue),
    timepoints: timeline.timepoints.map((tp) => ({
      index: tp.index, line: tp.line, label: tp.label, startLine: tp.startLine, endLine: tp.endLine, time: tp.time,
      barometricMmhg: tp.barometricMmhg, gasUnit: tp.gasUnit, shownGasUnit: tp.shownGasUnit, ageYears: tp.ageYears,
      stated: tp.stated.map(stated),
      values: [...tp.values.entries()].map(([id, v]) => [id, stated(v.stated), origin(v.origin)]),
      // The readers that build nothing must agree with the values built.
      size: tp.values.size,
      quick: FIELD_IDS.map((id) => [id, tp.values.has(id), tp.values.numberOf(id), tp.values.originOf(id)]),
    })),
    derivations: timeline.timepoints.map((tp) => {
      const d = r.analysis.derivation(tp.index);
      return { timepoint: d.timepoint, derived: d.derived.map(derived), missing: d.missing, notApplicable: d.notApplicable, interpretations: d.interpretations };
    }),
    hints: inlayHints(r, WHOLE_NOTE, ALL_HINTS),
    symbols: documentSymbols(r),
    folding: foldingRanges(r),
    // The trend view's points, kept per timepoint object across edits.
    trendGasUnit: trendGasUnit(r),
    trends: trendPoints(r),
  };
}

/**
 * Equal as JSON: equal for a user, and far quicker to establish than a deep comparison. A
 * difference is then shown by a deep comparison (which may still pass on key order alone).
 */
export function sameAsJson(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}
