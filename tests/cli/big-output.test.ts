// The command line's output of one big note: a JSON entry written a timepoint at a time, the
// indentation written by JSON.stringify itself, and long text written in pieces. Each must give
// the bytes the whole would (the output of a 15,000-line note is tens of megabytes).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { Output } from '../../server/src/cli/output';
import { CheckJsonWriter, jsonFileEntry, jsonFileEntryOrProblem, timepointText, toJsonFinding, TOO_MUCH_JSON, type FileOutcome } from '../../server/src/cli/render-check';
import { timepointsJson } from '../../server/src/cli/timepoints-json';
import { generateNote } from '../bench/generate.mjs';

/** What the entry used to be: the whole note's JSON, each line after the first indented by four spaces. */
function wholeEntry(o: FileOutcome): string {
  const file = { path: o.path, problem: o.problem, findings: o.findings.map(toJsonFinding), ...(o.timepoints ? { timepoints: o.timepoints } : {}) };
  return JSON.stringify(file, null, 2).split('\n').join('\n    ');
}

function writtenJson(list: readonly FileOutcome[]): { text: string; writes: string[] } {
  const writes: string[] = [];
  const writer = new CheckJsonWriter({ write: (s: string) => { writes.push(s); } });
  for (const o of list) writer.file(o);
  writer.end();
  return { text: writes.join(''), writes };
}

describe('a JSON entry written a timepoint at a time', () => {
  const text = generateNote(60, 3);
  const result = checkNote(text);
  const timepoints = timepointsJson(result);
  const outcome: FileOutcome = { path: 'ward/big.pneu', findings: result.findings, problem: null, timepoints };

  it('is the entry the whole JSON gives, from the timepoints or from their texts', () => {
    expect(timepoints.length).toBe(60);
    expect(jsonFileEntry(outcome)).toBe(wholeEntry(outcome));
    const texts: FileOutcome = { path: outcome.path, findings: outcome.findings, problem: null, timepointTexts: timepointsJson(result, timepointText) };
    expect(jsonFileEntry(texts)).toBe(wholeEntry(outcome));
    expect(jsonFileEntryOrProblem(texts)).toEqual({ entry: wholeEntry(outcome), problem: null });
    // In the whole output, beside a note without timepoints and one that could not be read.
    const others: FileOutcome[] = [{ path: 'ward/a.pneu', findings: [], problem: null, timepoints: [] }, { path: 'gone.pneu', findings: [], problem: 'no such file or folder' }];
    expect(writtenJson([texts, ...others]).text).toBe(writtenJson([outcome, ...others]).text);
    const whole = JSON.parse(writtenJson([texts, ...others]).text) as { files: { timepoints?: unknown[] }[] };
    expect(whole.files[0]!.timepoints).toEqual(JSON.parse(JSON.stringify(timepoints)));
  });

  it('is written in parts of at most some tens of thousands of characters, never as one string', () => {
    const texts: FileOutcome = { path: outcome.path, findings: outcome.findings, problem: null, timepointTexts: timepointsJson(result, timepointText) };
    const { writes } = writtenJson([texts]);
    expect(writes.length).toBeGreaterThan(5);
    // A part longer than the gathering limit (32 K characters) is written alone, as it is: the
    // entry's start (its findings), or a timepoint after its comma and line break.
    for (const w of writes) {
      const alone = w.endsWith('"timepoints": [') || texts.timepointTexts!.some((t) => w.endsWith(t) && w.length - t.length <= ',\n        '.length);
      expect(w.length <= 1 << 15 || alone).toBe(true);
    }
  });

  it('gives a problem instead of timepoints that are there as texts too, when they are more JSON than a string holds', () => {
    const tooBig = { toJSON() { throw new RangeError('Invalid string length'); } };
    const { entry, problem } = jsonFileEntryOrProblem({ path: 'huge.pneu', findings: [], problem: null, timepoints: [tooBig] });
    expect(problem).toBe(TOO_MUCH_JSON);
    expect(JSON.parse(entry)).toEqual({ path: 'huge.pneu', problem: TOO_MUCH_JSON, findings: [] });
  });

  it('is indented as splitting the JSON into lines would indent it, whatever the value', () => {
    const values: unknown[] = [
      {}, [], { a: [] }, { a: {} }, [[[]]], 'line\nbreak', 12.5, null, true,
      { text: 'a “quoted” – dash ÷ 😀 \u2028 \u0000', list: [1, [2, { deep: [3, []] }]], empty: '' },
      timepoints[0],
    ];
    for (const value of values) expect(timepointText(value)).toBe(JSON.stringify(value, null, 2).split('\n').join('\n        '));
    // What has no JSON, as a member of a list.
    expect(timepointText(undefined)).toBe('null');
  });
});

describe('long text written in pieces', () => {
  it('writes the same characters, in pieces of about a megabyte, never between the halves of a surrogate pair', () => {
    const pieces: string[] = [];
    const output = new Output({ write: (s: string) => { pieces.push(s); return true; } });
    // A pair straddles the first megabyte's end, and the text is not a whole number of pieces.
    const mega = 1 << 20;
    const text = `${'a'.repeat(mega - 1)}😀${'é'.repeat(mega)}😀${'b'.repeat(12345)}`;
    output.write(text);
    expect(pieces.join('')).toBe(text);
    expect(pieces.length).toBe(3);
    for (const piece of pieces) {
      expect(piece.length).toBeLessThanOrEqual(mega + 1);
      const last = piece.charCodeAt(piece.length - 1);
      expect(last >= 0xd800 && last <= 0xdbff, 'ends with the first half of a pair').toBe(false);
      expect(Buffer.from(piece, 'utf8').toString('utf8')).toBe(piece);
    }
    // Short text goes out as it is.
    pieces.length = 0;
    output.write('short');
    expect(pieces).toEqual(['short']);
  });
});
