// Options of check, export and docs: numbers are plain decimal whole numbers or a usage error;
// messages name the option as typed, in one line of plain words; a negative number after an
// option that takes a value is its value; docs reports paths it cannot use in one line.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { memoryIo, type MemoryIo } from '../helpers/memory-io';
import { run } from '../../server/src/cli/main';

const io = (cwd = process.cwd()): MemoryIo => memoryIo({ cwd });

const NOTE = 'samples/icu-ventilated-lung-injury.pneu';

/** Runs a command that must fail with a usage error; returns its one line on standard error. */
async function usageError(args: string[]): Promise<string> {
  const out = io();
  const code = await run(args, out);
  expect(code, args.join(' ')).toBe(2);
  expect(out.out(), args.join(' ')).toBe('');
  const lines = out.err().split('\n');
  expect(lines, args.join(' ')).toHaveLength(2); // one line and its line break
  return lines[0]!;
}

describe('whole-number options', () => {
  it('refuse --shift-days that is empty, blank, hexadecimal, exponent or fractional (never a silent 0)', async () => {
    for (const value of ['', ' ', '0x10', '1e3', '1.5', '3 ', 'three', '100001']) {
      expect(await usageError(['export', '--format', 'jsonl', '--shift-days', value, NOTE]), JSON.stringify(value))
        .toBe(`pneumark export: --shift-days: expected a whole number of days from -100000 to 100000 (got ${JSON.stringify(value)})`);
    }
  });

  it('refuse --max-warnings and --jobs that are empty or not plain decimal digits', async () => {
    for (const value of ['', ' ', '0x10', '1e3', '-1', '2.0']) {
      expect(await usageError(['check', '--max-warnings', value, NOTE]), JSON.stringify(value))
        .toBe(`pneumark check: --max-warnings: expected a whole number from 0 to 1,000,000,000 (got ${JSON.stringify(value)})`);
      expect(await usageError(['check', '--jobs', value, NOTE]), JSON.stringify(value))
        .toBe(`pneumark check: --jobs: expected a whole number from 0 to 64 (got ${JSON.stringify(value)})`);
    }
    expect(await usageError(['export', '--format', 'csv', '--jobs', '', NOTE])).toMatch(/^pneumark export: --jobs: expected a whole number from 0 to 64/);
  });

  it('take plain whole numbers, and a negative --shift-days written with a space', async () => {
    const day = async (args: string[]): Promise<unknown> => {
      const out = io();
      expect(await run(['export', '--format', 'jsonl', ...args, NOTE], out), args.join(' ')).toBe(0);
      return (JSON.parse(out.out().split('\n')[0]!) as { day: unknown }).day;
    };
    const unshifted = await day([]);
    expect(unshifted).toBe(1);
    expect(await day(['--shift-days', '-3'])).toBe(-2);
    expect(await day(['--shift-days=-3'])).toBe(-2);
    expect(await day(['--shift-days', '+2'])).toBe(3);
    expect(await day(['--shift-days', '10'])).toBe(11);
    const check = io();
    expect(await run(['check', '--max-warnings', '10', '--jobs', '0', NOTE], check)).toBe(0);
  });
});

describe('option problems', () => {
  it('name the option as typed, in plain words on one line', async () => {
    expect(await usageError(['check', '--max-warnings', '-1', NOTE])).toBe('pneumark check: --max-warnings: expected a whole number from 0 to 1,000,000,000 (got "-1")');
    expect(await usageError(['check', '--exclude', '', NOTE])).toBe('pneumark check: --exclude: must not be empty (got "")');
    expect(await usageError(['check', '--format', 'xml', NOTE])).toBe('pneumark check: --format: must be one of text, json or sarif (got "xml")');
    expect(await usageError(['check', '--colour', NOTE])).toBe('pneumark check: unknown option --colour (see --help)');
    expect(await usageError(['check', '-notes.pneu'])).toBe('pneumark check: unknown option -n (see --help); for a note named -notes.pneu, write ./-notes.pneu or put -- before it');
    expect(await usageError(['fmt', '--write', '--a.PNEU'])).toBe('pneumark fmt: unknown option --a.PNEU (see --help); for a note named --a.PNEU, write ./--a.PNEU or put -- before it');
    expect(await usageError(['check', NOTE, '--format'])).toBe('pneumark check: --format needs a value');
    expect(await usageError(['check', '--quiet=yes', NOTE])).toBe('pneumark check: --quiet takes no value');
    expect(await usageError(['check', '--format', '-x', NOTE])).toBe('pneumark check: --format needs a value (write --format=VALUE for a value that starts with -)');
    expect(await usageError(['export', NOTE])).toBe('pneumark export: --format: is required: csv, jsonl or fhir');
    expect(await usageError(['export', '--format', 'xml', NOTE])).toBe('pneumark export: --format: must be one of csv, jsonl or fhir (got "xml")');
  });

  it('never show the schema key or the validator\'s wording', async () => {
    for (const args of [['check', '--max-warnings', 'x', NOTE], ['export', '--format', 'csv', '--shift-days', '1.5', NOTE], ['check', '--exclude', '', NOTE], ['check', '--jobs', '-1', NOTE]]) {
      const line = await usageError(args);
      expect(line, args.join(' ')).not.toMatch(/maxWarnings|shiftDays|exclude\.0|Invalid input|expected int|received|Too small|ambiguous/);
    }
  });
});

describe('docs', () => {
  it('reports a path it cannot write or read in one line, with exit code 2', async () => {
    expect(await usageError(['docs', '--write', '/nonexistent/x.md'])).toBe('pneumark docs: --write "/nonexistent/x.md": cannot be written (no such file or folder)');
    expect(await usageError(['docs', '--grammar', 'missing.md'])).toBe('pneumark docs: --grammar "missing.md": cannot be read (no such file or folder)');
  });

  it('refuses a name that is no check\'s code or alias, with the check it likely meant', async () => {
    expect(await usageError(['docs', 'extra'])).toBe('pneumark docs: "extra" is not the code or alias of a check (`pneumark docs` lists them all)');
    expect(await usageError(['docs', 'PN405', 'PN41O'])).toBe('pneumark docs: "PN41O" is not the code or alias of a check; did you mean PN410 (oxygenation-reading)?');
  });

  it('prints the sections of docs/checks.md of the checks named, by code in any case or alias, in the order of the codes, each once', async () => {
    // An educator points a learner at one check (`pneumark docs PN405`) rather than the whole list.
    const out = io();
    expect(await run(['docs', 'driving-pressure-high', 'pn326', 'PN405'], out)).toBe(0);
    const text = out.out();
    const whole = readFileSync('docs/checks.md', 'utf8');
    const sectionOf = (code: string) => {
      const start = whole.indexOf(`## ${code} `);
      return whole.slice(start, whole.indexOf('<a id=', start));
    };
    expect(text).toBe(`${sectionOf('PN326')}${sectionOf('PN405')}Pneumark supports, never replaces, clinical judgement: defer to local protocols and licensed practice.\n`);
    expect(text).toContain('```pneu\n@ day 1 08:00\nvent mode VC');
  });

  it('writes to a path relative to the working folder, and leaves every file alone when one cannot be read', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-docs-'));
    const out = io(dir);
    expect(await run(['docs', '--write', 'checks.md'], out)).toBe(0);
    expect(readFileSync(join(dir, 'checks.md'), 'utf8')).toMatch(/PN101/);
    writeFileSync(join(dir, 'checks.md'), 'old');
    const failed = io(dir);
    expect(await run(['docs', '--write', 'checks.md', '--grammar', 'missing.md'], failed)).toBe(2);
    expect(readFileSync(join(dir, 'checks.md'), 'utf8')).toBe('old');
  });
});

describe('an option that takes one value, given twice', () => {
  it('is a usage error naming both values, not the last one silently winning', async () => {
    expect(await usageError(['check', '--format', 'json', NOTE, '--format', 'sarif']))
      .toBe('pneumark check: --format is given twice ("json", then "sarif"); give it once');
    expect(await usageError(['check', '--max-warnings=0', '--max-warnings', '10', NOTE]))
      .toBe('pneumark check: --max-warnings is given twice ("0", then "10"); give it once');
    expect(await usageError(['export', '--format', 'csv', '--shift-days', '-3', '--shift-days', '-3', NOTE]))
      .toBe('pneumark export: --shift-days is given twice ("-3", then "-3"); give it once');
  });

  it('--exclude and flags may be repeated', async () => {
    const out = io();
    expect(await run(['check', '--quiet', '--quiet', '--exclude', 'a/', '--exclude', 'b/', NOTE], out)).toBe(0);
    expect(out.err()).toBe('');
  });
});

describe('--max-warnings', () => {
  it('says how many warnings, in the singular for one', async () => {
    const out = io();
    expect(await run(['check', '--max-warnings', '0', NOTE], out)).toBe(1);
    expect(out.err()).toBe('pneumark: 1 warning, more than --max-warnings 0\n');
  });
});

describe('an empty path argument', () => {
  it('is a usage error for every command, never the working folder (fmt --write "" would rewrite it all)', async () => {
    const line = 'an empty argument is not a path (is a variable unset?); name a file, folder or pattern, or . for the working folder';
    expect(await usageError(['check', ''])).toBe(`pneumark check: ${line}`);
    expect(await usageError(['check', NOTE, ''])).toBe(`pneumark check: ${line}`);
    expect(await usageError(['export', '', '--format', 'csv'])).toBe(`pneumark export: ${line}`);
    expect(await usageError(['fmt', '--write', ''])).toBe(`pneumark fmt: ${line}`);
    expect(await usageError(['fmt', '--check', ''])).toBe(`pneumark fmt: ${line}`);
    expect(await usageError(['show', ''])).toBe(`pneumark show: ${line}`);
  });
});
