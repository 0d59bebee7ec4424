// The trend view's panel as the extension drives it, with a stand-in for VS Code
// (fake-vscode.ts) and for the server: which note it shows, live updates, a closed note,
// restoring after a reload of the window, going to a timepoint.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { TrendPoint, TrendsParams, TrendsResult } from '../../server/src/protocol';
import { changeLanguage, closeDocument, FakeWebviewPanel, openEditor, resetFake, state, Uri } from './fake-vscode';

vi.mock('vscode', async () => (await import('./fake-vscode')).vscodeModule);
const { TrendView } = await import('../../client/src/trend-view');

function point(line: number, pao2: number): TrendPoint {
  return { timepoint: line, label: `at ${line}`, line, minutes: null, values: { pao2: { value: pao2, unit: 'mmHg' } }, carried: [] };
}

/** A server that knows the open Pneumark notes only (as the language server does). */
function server(delays: Record<string, number> = {}) {
  const asked: string[] = [];
  let pao2 = 70;
  const send = async <R>(_m: string, params: unknown): Promise<R> => {
    const { uri } = params as TrendsParams;
    asked.push(uri);
    await new Promise((r) => setTimeout(r, delays[uri] ?? 0));
    const open = state.documents.some((d) => d.uri.toString() === uri && d.languageId === 'pneumark');
    const result: TrendsResult | null = open ? { uri, version: 1, points: [point(2, pao2)] } : null;
    return result as R;
  };
  return { send, asked, setPao2: (v: number) => { pao2 = v; } };
}

const extensionUri = Uri.file('/ext');
let view: InstanceType<typeof TrendView>;
const panel = (): FakeWebviewPanel => state.panels[0]!;
const lastPosted = () => panel().posted[panel().posted.length - 1] as Record<string, unknown>;

beforeEach(() => {
  resetFake();
  vi.useFakeTimers();
});
afterEach(() => {
  view?.dispose();
  vi.useRealTimers();
});

describe('the trend view', () => {
  it('opens beside the note with a strict page, and names the note in its title', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    const editor = openEditor('/work/icu.pneu', '@ 08:00\nabg 7.3/40/70/24');
    view.show(editor.document as never);
    await vi.runAllTimersAsync();
    expect(panel().title).toBe('Trends: icu.pneu');
    expect(panel().options).toMatchObject({ enableScripts: true, enableCommandUris: false, localResourceRoots: [Uri.joinPath(extensionUri, 'dist', 'webview')] });
    expect(panel().webview.html).toMatch(/script-src 'nonce-[A-Za-z0-9+/=]{24}'/);
    expect(lastPosted()).toMatchObject({ type: 'trends', note: 'icu.pneu', uri: 'file:///work/icu.pneu', closed: false, points: [point(2, 70)] });
  });

  it('follows the note the user switches to', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    const first = openEditor('/work/a.pneu', '@ 08:00');
    view.show(first.document as never);
    await vi.runAllTimersAsync();
    openEditor('/work/b.pneu', '@ 09:00');
    await vi.runAllTimersAsync();
    expect(panel().title).toBe('Trends: b.pneu');
    expect(lastPosted()).toMatchObject({ note: 'b.pneu', uri: 'file:///work/b.pneu' });
    // A file of another language leaves the view on the last note.
    openEditor('/work/README.md', '# x', { languageId: 'markdown' });
    await vi.runAllTimersAsync();
    expect(panel().title).toBe('Trends: b.pneu');
  });

  it('never shows one note\'s points under another\'s name when answers cross', async () => {
    const { send } = server({ 'file:///work/a.pneu': 500 });
    view = new TrendView(extensionUri, () => send, 10);
    const a = openEditor('/work/a.pneu', '@ 08:00');
    view.show(a.document as never);
    await vi.advanceTimersByTimeAsync(10);
    openEditor('/work/b.pneu', '@ 09:00');
    await vi.runAllTimersAsync();
    expect(panel().postedOf('trends').map((m) => m['uri'])).toEqual(['file:///work/b.pneu']);
  });

  it('updates when its note is analysed again, and not for other notes', async () => {
    const { send, asked, setPao2 } = server();
    view = new TrendView(extensionUri, () => send, 10);
    const editor = openEditor('/work/a.pneu', '@ 08:00');
    view.show(editor.document as never);
    await vi.runAllTimersAsync();
    asked.length = 0;
    setPao2(85);
    view.noteAnalysed('file:///work/other.pneu');
    view.noteAnalysed('file:///work/a.pneu');
    view.noteAnalysed('file:///work/a.pneu');
    await vi.runAllTimersAsync();
    expect(asked).toEqual(['file:///work/a.pneu']);
    expect(lastPosted()).toMatchObject({ points: [point(2, 85)] });
  });

  it('keeps the last trends of a note that was closed, and says it is closed', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    const editor = openEditor('/work/a.pneu', '@ 08:00');
    view.show(editor.document as never);
    await vi.runAllTimersAsync();
    closeDocument(editor.document);
    await vi.runAllTimersAsync();
    expect(lastPosted()).toMatchObject({ type: 'trends', closed: true, points: [point(2, 70)] });
    // The page reloads (hidden and shown again): the same.
    panel().receive({ type: 'ready' });
    await vi.runAllTimersAsync();
    expect(lastPosted()).toMatchObject({ type: 'trends', closed: true, points: [point(2, 70)] });
  });

  it('says its note is not open as a Pneumark note once its language mode is changed, rather than that it has no timepoints', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    const editor = openEditor('/work/a.pneu', '@ 08:00');
    view.show(editor.document as never);
    await vi.runAllTimersAsync();
    expect(lastPosted()).toMatchObject({ type: 'trends', points: [point(2, 70)] });
    // VS Code closes the note and opens it again in the new language: the new document is there
    // by the time the old one's closing is told.
    const again = openEditor('/work/a.pneu', '@ 08:00', { languageId: 'plaintext' });
    closeDocument(editor.document);
    await vi.runAllTimersAsync();
    expect(lastPosted()).toEqual({ type: 'notice', uri: 'file:///work/a.pneu', message: 'a.pneu is not open as a Pneumark note: set its language mode to Pneumark to see its trends.' });
    expect(panel().title).toBe('Trends: a.pneu');
    // Set back to Pneumark: the note is analysed again, and its trends come back.
    openEditor('/work/a.pneu', '@ 08:00');
    closeDocument(again.document);
    view.noteAnalysed('file:///work/a.pneu');
    await vi.runAllTimersAsync();
    expect(lastPosted()).toMatchObject({ type: 'trends', closed: false, points: [point(2, 70)] });
  });

  it('says its note is not open as a Pneumark note when the language mode of the same document is changed, as VS Code tells it', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    const editor = openEditor('/work/a.pneu', '@ 08:00');
    view.show(editor.document as never);
    await vi.runAllTimersAsync();
    changeLanguage(editor.document, 'plaintext');
    await vi.runAllTimersAsync();
    expect(lastPosted()).toEqual({ type: 'notice', uri: 'file:///work/a.pneu', message: 'a.pneu is not open as a Pneumark note: set its language mode to Pneumark to see its trends.' });
    changeLanguage(editor.document, 'pneumark');
    await vi.runAllTimersAsync();
    expect(lastPosted()).toMatchObject({ type: 'trends', closed: false, points: [point(2, 70)] });
  });

  it('says so when the note it is restored with after a reload opens in another language', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    openEditor('/work/a.pneu', '@ 08:00', { languageId: 'plaintext' });
    const restored = new FakeWebviewPanel('pneumark.trends', 'Trends: a.pneu', {});
    await view.deserializeWebviewPanel(restored as never, { uri: 'file:///work/a.pneu' });
    await vi.runAllTimersAsync();
    expect(restored.posted.at(-1)).toMatchObject({ type: 'notice', message: expect.stringMatching(/^a\.pneu is not open as a Pneumark note/) });
  });

  it('is restored after a reload of the window with the note it showed, opened for the server', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    state.files.set('file:///work/a.pneu', '@ 08:00');
    const restored = new FakeWebviewPanel('pneumark.trends', 'Trends: a.pneu', {});
    // VS Code shows the restored page only once the serializer is done: it must not wait for the page.
    restored.initializing = true;
    let done = false;
    void view.deserializeWebviewPanel(restored as never, { uri: 'file:///work/a.pneu' }).then(() => { done = true; });
    await vi.runAllTimersAsync();
    expect(done).toBe(true);
    restored.load();
    await vi.runAllTimersAsync();
    expect(restored.webview.html).toMatch(/Content-Security-Policy/);
    expect(restored.webview.options).toMatchObject({ enableScripts: true });
    expect(state.documents.map((d) => d.uri.toString())).toEqual(['file:///work/a.pneu']);
    expect(restored.posted.at(-1)).toMatchObject({ type: 'trends', note: 'a.pneu', closed: false, points: [point(2, 70)] });
  });

  it('says so after a reload when its note is gone, or when it had no note', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    const restored = new FakeWebviewPanel('pneumark.trends', 'Trends', {});
    await view.deserializeWebviewPanel(restored as never, { uri: 'file:///work/deleted.pneu' });
    await vi.runAllTimersAsync();
    expect(restored.posted.at(-1)).toEqual({ type: 'notice', message: 'deleted.pneu could not be opened: it may have been moved or deleted.' });
    restored.dispose();
    const another = new FakeWebviewPanel('pneumark.trends', 'Trends', {});
    await view.deserializeWebviewPanel(another as never, undefined);
    await vi.runAllTimersAsync();
    expect(another.posted.at(-1)).toMatchObject({ type: 'notice', message: expect.stringMatching(/run "Pneumark: Show Trends"/) });
  });

  it('moves the editor to a timepoint from the page, in the column that shows the note', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    const editor = openEditor('/work/a.pneu', '@ 08:00\n\n@ 09:00');
    editor.viewColumn = 3;
    view.show(editor.document as never);
    await vi.runAllTimersAsync();
    panel().receive({ type: 'reveal', line: 2 });
    // A message that is not one of ours is ignored.
    panel().receive({ type: 'reveal', line: -1 });
    panel().receive({ type: 'reveal', line: '2' });
    await vi.runAllTimersAsync();
    expect(state.shownDocuments).toHaveLength(1);
    expect(state.shownDocuments[0]).toMatchObject({ uri: 'file:///work/a.pneu', options: { viewColumn: 3 } });
  });

  it('starts afresh when the panel was closed, without keeping the old panel\'s listeners', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    const editor = openEditor('/work/a.pneu', '@ 08:00');
    view.show(editor.document as never);
    panel().dispose();
    expect(view.note).toBeNull();
    view.show(editor.document as never);
    await vi.runAllTimersAsync();
    expect(state.panels).toHaveLength(2);
    expect(state.panels[1]!.postedOf('trends')).toHaveLength(1);
  });

  it('names a note whose file name holds characters that reorder text with those characters escaped', async () => {
    const { send } = server();
    view = new TrendView(extensionUri, () => send, 10);
    const editor = openEditor('/work/a\u202Eunp.pneu', '@ 08:00');
    view.show(editor.document as never);
    await vi.runAllTimersAsync();
    expect(panel().title).toBe('Trends: a\\u{202E}unp.pneu');
    expect(lastPosted()).toMatchObject({ type: 'trends', note: 'a\\u{202E}unp.pneu' });
  });

  it('says why a note too large to analyse has no trends, instead of calling it a note without timepoints', async () => {
    const notAnalysed = 'Pneumark does not analyse notes over 2048 KB (this one is 3.1 MB): split it into smaller notes, or raise pneumark.maxNoteSizeKb.';
    const send = async <R>(_m: string, params: unknown): Promise<R> => ({ uri: (params as TrendsParams).uri, version: 1, points: [], notAnalysed } as R);
    view = new TrendView(extensionUri, () => send, 10);
    const editor = openEditor('/work/big.pneu', '@ 08:00');
    view.show(editor.document as never);
    await vi.runAllTimersAsync();
    expect(lastPosted()).toEqual({ type: 'notice', message: `big.pneu: ${notAnalysed}`, uri: 'file:///work/big.pneu' });
  });

  it('says why it shows nothing outside a note', () => {
    view = new TrendView(extensionUri, () => null, 10);
    const editor = openEditor('/work/README.md', '# x', { languageId: 'markdown' });
    view.show(editor.document as never);
    expect(state.panels).toHaveLength(0);
    expect(state.messages[0]?.message).toBe('Open a Pneumark note (.pneu) to see its trends.');
  });
});
