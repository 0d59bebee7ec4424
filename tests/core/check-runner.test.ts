// The runner moves one context from check to check (note scope) and from timepoint to timepoint:
// each finding still carries the code of the check that reported it, a check that throws becomes
// an internal finding under its own name while the others run, and a shared value is computed once
// per note (note scope) and once per timepoint (timepoint scope).
import { describe, expect, it } from 'vitest';
import { analyseText } from '../../server/src/core/analysis/analyse';
import { runChecks } from '../../server/src/core/check-note';
import { defineCheck, type CheckDef } from '../../server/src/core/checks/check';
import { withDefaults } from '../../server/src/core/settings';
import { toRange } from '../../server/src/core/syntax/tree';
import type { Kept } from '../../server/src/core/util/small-store';

const NOTE = '@ 08:00\nvitals hr 80\n@ 09:00\nvitals hr 90\n';
const DOC = { fires: 'test', example: 'test', fix: 'test' };

function check(code: string, alias: string, parts: Pick<CheckDef, 'run' | 'runTimepoint'>): CheckDef {
  return defineCheck({ code, alias, title: alias, severity: 'warning', tags: ['internal'], doc: DOC, source: 'test', ...parts });
}

describe('check runner contexts', () => {
  it('gives each finding the code of the check that reported it, note and timepoint scope alike', () => {
    const settings = withDefaults({});
    const calls = { note: 0, timepoint: 0 };
    const noteCount: Kept<number, unknown> = { name: 'note count', compute: () => ++calls.note };
    const timepointCount: Kept<number, unknown> = { name: 'timepoint count', compute: () => ++calls.timepoint };
    const checks = [
      check('PN981', 'first-note', { run(ctx) { ctx.report({ range: toRange(0, { start: 0, end: 1 }), message: `first ${ctx.shared(noteCount)}` }); } }),
      check('PN982', 'throws-note', { run() { throw new Error('broken'); } }),
      check('PN983', 'second-note', { run(ctx) { ctx.report({ range: toRange(1, { start: 0, end: 1 }), message: `second ${ctx.shared(noteCount)}` }); } }),
      check('PN984', 'first-timepoint', { runTimepoint(ctx) { ctx.report({ range: toRange(ctx.timepoint.startLine, { start: 0, end: 2 }), message: `tp ${ctx.timepoint.index} ${ctx.shared(timepointCount)}` }); } }),
      check('PN985', 'second-timepoint', { runTimepoint(ctx) { ctx.report({ range: toRange(ctx.timepoint.startLine, { start: 0, end: 3 }), message: `tp ${ctx.timepoint.index} again ${ctx.shared(timepointCount)}` }); } }),
    ];
    const { findings } = runChecks(analyseText(NOTE, settings), settings, checks);
    expect(findings.map((f) => [f.code, f.range.start.line, f.message.replace(/failed on this note: .*/, 'failed')])).toEqual([
      ['PN900', 0, 'Check PN982 (throws-note) failed'],
      ['PN981', 0, 'first 1'],
      ['PN984', 0, 'tp 0 1'],
      ['PN985', 0, 'tp 0 again 1'],
      ['PN983', 1, 'second 1'],
      ['PN984', 2, 'tp 1 2'],
      ['PN985', 2, 'tp 1 again 2'],
    ]);
    expect(calls).toEqual({ note: 1, timepoint: 2 });
    expect(findings.find((f) => f.code === 'PN981')?.docAnchor).toBe('pn981-first-note');
  });

  it('runs every check when none is switched off, and leaves out those switched off by code (any case) or alias', () => {
    const text = '@ 08:00\nvitals hr 300, spo2 104\n';
    const codes = (disabledChecks: string[]) => {
      const settings = withDefaults({ disabledChecks });
      return runChecks(analyseText(text, settings), settings).findings.map((f) => f.code);
    };
    expect(codes([])).toEqual(['PN302', 'PN306']);
    expect(codes(['pn302'])).toEqual(['PN306']);
    expect(codes(['PN306', 'unusual-value'])).toEqual([]);
  });

  it('reports the parser\'s issues of each timepoint line by line, each under its own check, whatever the lines around them', () => {
    const text = 'vitals hr\n@ 08:00\nvitals hr 80\nvitals spo2 9,5\nvitals rr\n@ 09:00\nvitals hr 90\n@ 10:00\nvitls hr 80\nvitals hr\n';
    const found = runChecks(analyseText(text, withDefaults({})), withDefaults({})).findings.filter((f) => /^PN1/.test(f.code));
    expect(found.map((f) => [f.code, f.range.start.line])).toEqual([['PN102', 0], ['PN103', 3], ['PN102', 4], ['PN101', 8], ['PN102', 9]]);
  });

  it('gives the same messages with and without a cache of timepoint findings', () => {
    const settings = withDefaults({});
    const text = '@ 08:00\noxygen room air\nabg 7.21/68/52/26\n@ 09:00\nvitals hr 80, foo 3\n';
    const plain = runChecks(analyseText(text, settings), settings).findings;
    const cached = runChecks(analyseText(text, settings), settings, undefined, new WeakMap()).findings;
    expect(plain.length).toBeGreaterThan(3);
    expect(cached.map((f) => [f.code, f.message, f.range])).toEqual(plain.map((f) => [f.code, f.message, f.range]));
  });
});
