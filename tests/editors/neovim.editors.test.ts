/**
 * The README's Neovim configuration, run in real headless Neovim against the bundled server:
 * notes get the filetype and a client, diagnostics arrive with their codes, hovers answer, the
 * formatter's edits apply, a project file above the note applies, and settings given in the
 * configuration reach the server (Neovim 0.7 pushes them). `npm run test:editors`.
 */
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { neovimVersion, readmeNeovimConfig, REPO, runNeovim, type NeovimRun, type SeenNote } from './neovim';

/** A note in a folder of its own (no project folder above it: the system's temporary folder). */
function note(name: string, text: string, config?: object): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-nvim-note-'));
  if (config) writeFileSync(join(dir, 'pneumark.config.json'), JSON.stringify(config));
  mkdirSync(join(dir, 'notes'));
  const path = join(dir, 'notes', name);
  writeFileSync(path, text);
  return path;
}

/** [line, character] of the first `needle` in `text`, from 0. */
function at(text: string, needle: string): [number, number] {
  const lines = text.split('\n');
  const line = lines.findIndex((l) => l.includes(needle));
  if (line < 0) throw new Error(`no ${needle} in the note`);
  return [line, lines[line]!.indexOf(needle)];
}

const BROKEN = join(REPO, 'samples', 'broken-note.pneu');
const GAS = 'patient   age 45 y\n@ day 1 08:00\noxygen    mask, fio2 0.5\nabg       ph 7.32, pco2 6.0, po2 8.0\nvitls     hr 100\n';
/** Characters outside ASCII and outside the BMP before the findings: LSP counts UTF-16 units, Neovim bytes. */
const WIDE = 'patient   age 45 y\n@ day 1 08:00\nnote      called 😀 at 555-123-4567\n';
const TYPO = 'patient   age 45 y\n@ day 1 08:00\nvitls     hr 100\nvitals    \n';
const MESSY = 'patient age 60 y,  sex male\n@ day 1 08:00   admitted\nvitals hr 88,rr 20 # calm\nabg   7.40/40/90/24\n';

describe('the README\'s Neovim configuration', () => {
  it('is the Neovim 0.7 form: no vim.lsp.start, no vim.fs', () => {
    const config = readmeNeovimConfig();
    expect(config).toContain('vim.lsp.start_client(');
    expect(config).toContain('vim.lsp.buf_attach_client(');
    expect(config).not.toMatch(/vim\.lsp\.start\(|vim\.fs\b/);
  });
});

describe('in headless Neovim', () => {
  let run: NeovimRun;
  let broken: SeenNote, projectNote: SeenNote, loose: SeenNote, wide: SeenNote, typo: SeenNote;
  let projectPath: string;

  beforeAll(() => {
    neovimVersion(); // fails with how to install it
    projectPath = note('gas.pneu', GAS, { gasUnit: 'kPa' });
    const loosePath = note('messy.pneu', MESSY);
    const widePath = note('wide.pneu', WIDE);
    const typoPath = note('typo.pneu', TYPO);
    run = runNeovim([
      { path: BROKEN, waitFor: 'PN101' },
      {
        path: projectPath, waitFor: 'PN101', hovers: [at(GAS, 'po2 8.0'), at(GAS, '8.0')],
        then: { write: { path: join(projectPath, '..', '..', 'pneumark.config.json'), text: '{ "gasUnit": "kPa", "disabledChecks": ["PN410"] }\n' }, waitGone: 'PN410' },
      },
      { path: loosePath, format: true },
      { path: widePath, waitFor: 'PN504', then: { edit: { line: 2, find: '4567', text: '4567 or é𝄞 a.b@example.org' }, waitFor: 'PN505' } },
      { path: typoPath, waitFor: 'PN101', complete: [3, 10], action: { line: 2, title: 'vitals' }, then: { waitGone: 'PN101' } },
    ]);
    [broken, projectNote, loose, wide, typo] = run.notes as [SeenNote, SeenNote, SeenNote, SeenNote, SeenNote];
  }, 120_000);

  it('gives .pneu notes the pneumark filetype and one client per project folder', () => {
    expect(run.nvim).toBe(neovimVersion());
    for (const n of run.notes) {
      expect(n.filetype).toBe('pneumark');
      expect(n.attached).toBe(true);
    }
    expect(broken.client?.root).toBe(REPO); // the folder with .git
    expect(projectNote.client?.root).toBe(join(projectPath, '..', '..')); // the folder with pneumark.config.json
    expect(loose.client?.root).toBeNull(); // no project folder: a client of its own
    expect(new Set([loose, wide, typo].map((n) => n.client?.id)).size).toBe(1); // all outside any project folder
    expect(new Set(run.notes.map((n) => n.client?.id)).size).toBe(3);
  });

  it('shows the findings of a note with their codes, where they are', () => {
    expect(broken.diagnosticsArrived).toBe(true);
    const unknownSection = broken.diagnostics.find((d) => d.code === 'PN101');
    expect(unknownSection).toMatchObject({ lnum: 3, col: 0, severity: 1, source: 'pneumark' });
    expect(unknownSection?.message).toContain('`vitls` is not a section');
    // Every line the sample marks gets its finding.
    for (const code of ['PN104', 'PN102', 'PN103', 'PN106', 'PN201', 'PN301', 'PN308']) expect(broken.diagnostics.map((d) => d.code)).toContain(code);
  });

  it('reads a note with the project file above it (gas pressures in kPa) and answers hovers', () => {
    expect(projectNote.diagnosticsArrived).toBe(true);
    expect(projectNote.diagnostics.find((d) => d.code === 'PN101')?.lnum).toBe(4);
    const [onKey, onValue] = projectNote.hovers;
    expect(onValue).toContain('**PaO2**');
    expect(onValue).toContain('Value: **8.0 kPa** = 60 mmHg');
    expect(onKey).toContain('**PaO2**');
  });

  it('applies a change of that project file at once, though Neovim 0.7 reports no file changes', () => {
    expect(projectNote.diagnostics.map((d) => d.code)).toContain('PN410');
    expect(projectNote.settled).toBe(true);
    expect(projectNote.after?.map((d) => d.code)).toContain('PN101');
    expect(projectNote.after?.map((d) => d.code)).not.toContain('PN410');
  });

  it('places findings after wide characters where they are, before and after an edit Neovim sends in pieces', () => {
    // Neovim's columns are bytes; the server's, UTF-16 units: the client converts both ways.
    const bytesTo = (line: string, needle: string) => Buffer.byteLength(line.slice(0, line.indexOf(needle)));
    const line = WIDE.split('\n')[2]!;
    expect(wide.diagnostics.find((d) => d.code === 'PN504')).toMatchObject({ lnum: 2, col: bytesTo(line, '555'), end_col: Buffer.byteLength(line) });
    expect(wide.settled).toBe(true);
    const edited = line.replace('4567', '4567 or é𝄞 a.b@example.org');
    expect(wide.after?.find((d) => d.code === 'PN504')).toMatchObject({ lnum: 2, col: bytesTo(line, '555') });
    expect(wide.after?.find((d) => d.code === 'PN505')).toMatchObject({ lnum: 2, col: bytesTo(edited, 'a.b@'), end_col: Buffer.byteLength(edited) });
  });

  it('offers completions and applies a quick fix, whose edit clears the finding', () => {
    expect(typo.completions).toEqual(expect.arrayContaining(['hr', 'rr', 'spo2']));
    expect(typo.actions).toContain('Change to `vitals`');
    expect(typo.acted?.[2]).toBe('vitals    hr 100'); // the word replaced, the items kept in column 10 as the formatter writes them
    expect(typo.settled).toBe(true);
    expect(typo.after?.map((d) => d.code)).not.toContain('PN101');
  });

  it('formats a note with the formatter\'s edits applied by Neovim', () => {
    expect(loose.formatted).toEqual([
      'patient   age 60 y, sex male',
      '@ day 1 08:00  admitted',
      'vitals    hr 88, rr 20  # calm',
      'abg       7.40/40/90/24',
    ]);
  });
});

describe('settings in the README\'s Neovim configuration', () => {
  it('reach the server, which Neovim 0.7 cannot be asked for them', () => {
    neovimVersion();
    const path = note('gas.pneu', GAS);
    const settingsLine = 'local pneumark_settings = { pneumark = {} }';
    const run = runNeovim([{ path, waitFor: 'PN101', hovers: [at(GAS, '8.0')] }], (config) => {
      expect(config).toContain(settingsLine);
      return config.replace(settingsLine, "local pneumark_settings = { pneumark = { gasUnit = 'kPa', disabledChecks = { 'PN410' } } }");
    });
    const [seen] = run.notes as [SeenNote];
    expect(seen.diagnosticsArrived).toBe(true);
    expect(seen.hovers[0]).toContain('Value: **8.0 kPa** = 60 mmHg');
    expect(seen.diagnostics.map((d) => d.code)).not.toContain('PN410');
  }, 120_000);
});
