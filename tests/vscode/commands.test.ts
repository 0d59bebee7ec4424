// Convert Gas Units, Insert Timepoint and Open Check Documentation, with a stand-in for VS Code
// (fake-vscode.ts) and for the server.
import { readFileSync } from 'node:fs';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import type { ConvertUnitsParams, PlainTextEdit } from '../../server/src/protocol';
import { closeDocument, openEditor, Range, resetFake, state, Uri } from './fake-vscode';

vi.mock('vscode', async () => (await import('./fake-vscode')).vscodeModule);
const { CONVERT_PLACEHOLDER, checkDocs, convertNoteUnits, findCheck, insertTimepoint, linkCodesToCheckDocs, openCheckDocs, timepointInsertion } = await import('../../client/src/commands');

beforeEach(() => resetFake());

/** How VS Code finds links in a notification's message (a click on a `command:` one runs it). */
const NOTIFICATION_LINK = /\[([^\]]+)\]\(((?:https?:\/\/|command:|file:)[^)\s]+)(?: (["'])(.+?)(\3))?\)/i;

const NOTE = 'patient   age 60 y\n\n@ day 1 08:00  arrival\nabg       ph 7.30, pco2 50, po2 60\n';

/** A server that converts `pco2 50` to kPa (the edit as the server would give it). */
function converter(edits: PlainTextEdit[] = [{ range: { start: { line: 3, character: 24 }, end: { line: 3, character: 26 } }, newText: '6.7 kPa' }]) {
  const asked: ConvertUnitsParams[] = [];
  let before: () => void = () => undefined;
  const send = async <R>(_m: string, params: unknown): Promise<R> => {
    asked.push(params as ConvertUnitsParams);
    before();
    return edits as R;
  };
  return { send, asked, whileWorking: (f: () => void) => { before = f; } };
}

describe('Convert Gas Units of This Note', () => {
  it('converts the note to the unit picked', async () => {
    const editor = openEditor('/work/a.pneu', NOTE);
    const { send, asked } = converter();
    state.pick = 'kPa';
    await convertNoteUnits(send);
    expect(asked).toEqual([{ uri: 'file:///work/a.pneu', to: 'kPa' }]);
    expect(editor.document.lineAt(3).text).toBe('abg       ph 7.30, pco2 6.7 kPa, po2 60');
  });

  it('says in its picker what it converts, in words that fit the picker\'s input', async () => {
    openEditor('/work/a.pneu', NOTE);
    state.pick = 'kPa';
    await convertNoteUnits(converter().send);
    const options = state.quickPicks[0]?.options as { placeHolder?: string } | undefined;
    expect(options?.placeHolder).toBe(CONVERT_PLACEHOLDER);
    // The picker's input shows about 80 characters at its usual width: a longer one lost its end.
    expect(CONVERT_PLACEHOLDER.length).toBeLessThanOrEqual(80);
    expect(CONVERT_PLACEHOLDER).toMatch(/units gas line$/);
  });

  it('works on an untitled note', async () => {
    const editor = openEditor('Untitled-1', NOTE, { scheme: 'untitled' });
    const { send, asked } = converter();
    state.pick = 'kPa';
    await convertNoteUnits(send);
    expect(asked[0]?.uri).toBe('untitled:Untitled-1');
    expect(editor.document.lineAt(3).text).toContain('6.7 kPa');
  });

  it('changes nothing, and says so, when the note changed while the edits were worked out', async () => {
    const editor = openEditor('/work/a.pneu', NOTE);
    const { send, whileWorking } = converter();
    // The user types while the server works.
    whileWorking(() => editor.document.replace(new Range(0, 0, 0, 0), 'x'));
    state.pick = 'kPa';
    await convertNoteUnits(send);
    expect(editor.document.getText()).toBe(`x${NOTE}`);
    expect(state.messages).toEqual([expect.objectContaining({ kind: 'warning', message: expect.stringMatching(/changed while its units were being converted, so nothing was changed/) })]);
  });

  it('says why nothing happened: a read-only note, nothing to convert, no note, no server', async () => {
    const editor = openEditor('/work/a.pneu', NOTE);
    editor.document.readOnly = true;
    state.pick = 'kPa';
    await convertNoteUnits(converter().send);
    expect(state.messages.pop()?.message).toBe('a.pneu could not be changed: it is read-only.');
    editor.document.readOnly = false;
    await convertNoteUnits(converter([]).send);
    expect(state.messages.pop()?.message).toBe('Nothing to convert: the gas pressures of this note are already in kPa.');
    await convertNoteUnits(null);
    expect(state.messages.pop()?.message).toMatch(/language server is not running/);
    openEditor('/work/README.md', '# x', { languageId: 'markdown' });
    await convertNoteUnits(converter().send);
    expect(state.messages.pop()?.message).toBe('Open a Pneumark note (.pneu) to convert its gas units.');
  });

  it('says nothing was changed when the note was closed while the edits were worked out', async () => {
    const editor = openEditor('/work/a.pneu', NOTE);
    const { send, whileWorking } = converter();
    whileWorking(() => closeDocument(editor.document));
    state.pick = 'kPa';
    await convertNoteUnits(send);
    expect(state.appliedEdits).toEqual([]);
    expect(state.messages).toEqual([expect.objectContaining({ kind: 'warning', message: 'a.pneu was closed while its units were being converted, so nothing was changed.' })]);
  });

  it('shows a failed request as a message rather than a rejected promise', async () => {
    openEditor('/work/a.pneu', NOTE);
    state.pick = 'mmHg';
    await convertNoteUnits(async () => { throw new Error('server gone'); });
    expect(state.messages).toEqual([expect.objectContaining({ kind: 'error', message: 'The gas units could not be converted: server gone' })]);
  });
});

describe('Insert Timepoint', () => {
  const lines = ['patient   age 60 y', '', '@ day 1 08:00  arrival', 'vitals    hr 90', 'abg       7.30/50/60/24', '', '@ +2h  later', 'vitals    hr 80'];

  it('goes after the timepoint the cursor is in, not inside it', () => {
    // On `vitals` of the first timepoint: after its last line (the abg), before the next timepoint.
    expect(timepointInsertion(lines, 3)).toMatchObject({ line: 4, atEnd: true });
    expect(timepointInsertion(lines, 2)).toMatchObject({ line: 4, atEnd: true });
    expect(timepointInsertion(lines, 5)).toMatchObject({ line: 4, atEnd: true });
    expect(timepointInsertion(lines, 7)).toMatchObject({ line: 7, atEnd: true });
    // In the header: after the header, so the header lines stay before every timepoint.
    expect(timepointInsertion(lines, 0)).toMatchObject({ line: 0, atEnd: true });
  });

  it('offers an offset after a timepoint, a day and time for the first one', () => {
    expect(timepointInsertion(lines, 3).snippet).toBe('\n\n@ ${1|+1h,+30m,+15m,day 2 08:00|}  ${2:label}\n$0');
    expect(timepointInsertion(lines, 0).snippet).toContain('${1|day 1 08:00,08:00|}');
    expect(timepointInsertion([''], 0)).toEqual({ line: 0, atEnd: false, snippet: '@ ${1|day 1 08:00,08:00|}  ${2:label}\n$0' });
  });

  it('inserts a timepoint that the lines below it keep their own', async () => {
    const editor = openEditor('/work/a.pneu', lines.join('\n'), { line: 3 });
    await insertTimepoint();
    expect(editor.document.getText().split('\n')).toEqual([...lines.slice(0, 5), '', '@ +1h  label', '', ...lines.slice(5)]);
  });

  it('says so on a read-only note and outside a note', async () => {
    const editor = openEditor('/work/a.pneu', lines.join('\n'));
    editor.document.readOnly = true;
    await insertTimepoint();
    expect(state.messages.pop()?.message).toBe('a.pneu could not be changed: it is read-only.');
    openEditor('/work/b.txt', '', { languageId: 'plaintext' });
    await insertTimepoint();
    expect(state.messages.pop()?.message).toBe('Open a Pneumark note (.pneu) to insert a timepoint.');
  });

  it('names a read-only note whose file name looks like a link as text, never as a link that runs a command', async () => {
    const name = '[Retry](command:workbench.action.terminal.sendSequence?%7B%22text%22%3A%22rm%22%7D)\u202Egpj.pneu';
    const editor = openEditor(`/work/${name}`, lines.join('\n'));
    editor.document.readOnly = true;
    await insertTimepoint();
    const message = state.messages.pop()?.message ?? '';
    expect(message).not.toMatch(NOTIFICATION_LINK);
    expect(message).toBe('[Retry]\u200b(command:workbench.action.terminal.sendSequence?%7B%22text%22%3A%22rm%22%7D)\\u{202E}gpj.pneu could not be changed: it is read-only.');
  });
});

describe('Open Check Documentation', () => {
  const markdown = readFileSync('docs/checks.md', 'utf8');
  const extension = Uri.file('/ext');
  const docsUri = 'file:///ext/docs/checks.md';

  it('reads every check from the bundled documentation, with the anchor the preview scrolls to', () => {
    const docs = checkDocs(markdown);
    expect(docs.length).toBeGreaterThan(30);
    expect(docs[0]).toEqual({ code: 'PN101', alias: 'unknown-section', anchor: 'pn101-unknown-section', summary: 'Unknown section' });
    // Each anchor is one the document itself declares.
    for (const d of docs) expect(markdown).toContain(`<a id="${d.anchor}"></a>`);
    expect(findCheck(docs, 'pn405')?.alias).toBeDefined();
    expect(findCheck(docs, 'unknown-section')?.code).toBe('PN101');
  });

  it('opens the preview at the heading of the check named (its anchor, not just the code)', async () => {
    state.files.set(docsUri, markdown);
    await openCheckDocs(extension, 'PN101');
    expect(state.executed.map((e) => [e.command, String(e.args[0])])).toEqual([['markdown.showPreview', `${docsUri}#pn101-unknown-section`]]);
  });

  it('offers the list of checks when none is named', async () => {
    state.files.set(docsUri, markdown);
    state.pick = 'PN102 missing-value';
    await openCheckDocs(extension);
    expect(state.quickPicks[0]?.items.length).toBe(checkDocs(markdown).length + 1);
    expect(String(state.executed[0]?.args[0])).toBe(`${docsUri}#pn102-missing-value`);
  });

  it('opens the file at the heading where the Markdown preview is not there', async () => {
    state.files.set(docsUri, markdown);
    state.failingCommands.add('markdown.showPreview');
    await openCheckDocs(extension, 'PN102');
    const line = markdown.split('\n').findIndex((l) => l.startsWith('## PN102 '));
    expect(state.shownDocuments[0]?.uri).toBe(docsUri);
    expect((state.shownDocuments[0]?.options?.['selection'] as { start: { line: number } }).start.line).toBe(line);
  });

  it('says so when a name is no check', async () => {
    state.files.set(docsUri, markdown);
    await openCheckDocs(extension, 'PN999');
    expect(state.messages[0]?.message).toBe('PN999 is not a Pneumark check: showing the list of checks.');
    expect(String(state.executed[0]?.args[0])).toBe(docsUri);
  });

  it('shows a name given to it as text, never as a link', async () => {
    state.files.set(docsUri, markdown);
    await openCheckDocs(extension, '[PN101](command:workbench.action.quit)');
    expect(state.messages[0]?.message).not.toMatch(NOTIFICATION_LINK);
  });

  it('links a diagnostic\'s code to this command, which shows the check rendered at its heading', () => {
    // The server links PN405 to docs/checks.md#pn405-…; VS Code opened that as Markdown source at
    // its first line. The link runs Open Check Documentation with the code instead.
    type Code = { value: string | number; target: Uri } | string | undefined;
    const elsewhere = { value: 'PN101', target: Uri.parse('https://example.invalid/other.md#pn101') };
    const diagnostics: { code: Code }[] = [
      { code: { value: 'PN405', target: Uri.parse(`${docsUri}#pn405-driving-pressure-high`) } },
      { code: 'too-large' },
      { code: elsewhere },
      { code: undefined },
    ];
    linkCodesToCheckDocs(diagnostics as never);
    const linked = diagnostics[0]!.code as { value: string; target: Uri };
    expect(linked.value).toBe('PN405');
    const [command, query] = String(linked.target).split('?');
    expect(command).toBe('command:pneumark.openCheckDocs');
    expect(JSON.parse(decodeURIComponent(query!))).toEqual(['PN405']);
    // Codes that are no check's, or that link elsewhere, are left as they are.
    expect(diagnostics[1]!.code).toBe('too-large');
    expect(diagnostics[2]!.code).toBe(elsewhere);
    expect(diagnostics[3]!.code).toBeUndefined();
  });
});
