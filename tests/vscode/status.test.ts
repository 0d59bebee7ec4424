// The status bar item, with a stand-in for VS Code (fake-vscode.ts) and for the server.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { SummaryParams, SummaryResult } from '../../server/src/protocol';
import { activate, closeDocument, moveCursor, openEditor, resetFake, state } from './fake-vscode';

vi.mock('vscode', async () => (await import('./fake-vscode')).vscodeModule);
const { TimepointStatus, statusContent } = await import('../../client/src/status');

/** A server that answers with the figures of the line asked about, after `delay` ms. */
function server(delay = 0) {
  const asked: SummaryParams[] = [];
  const send = async <R>(_method: string, params: unknown): Promise<R> => {
    const p = params as SummaryParams;
    asked.push(p);
    await new Promise((r) => setTimeout(r, delay));
    const result: SummaryResult | null = p.line < 2 ? null : { label: `tp ${p.line}`, text: `P/F ${p.line * 10} · pH 7.3${p.line}`, tooltip: `tp ${p.line}` };
    return result as R;
  };
  return { asked, send };
}

let status: InstanceType<typeof TimepointStatus>;

beforeEach(() => {
  resetFake();
  vi.useFakeTimers();
});
afterEach(() => {
  status?.dispose();
  vi.useRealTimers();
});

describe('the status bar item', () => {
  it('shows the figures of the timepoint under the cursor, with a name for screen readers', async () => {
    const { send } = server();
    status = new TimepointStatus(() => send);
    const editor = openEditor('/work/a.pneu', 'patient age 50 y\n\n@ 08:00 first\nabg 7.3/40/80/24', { line: 2 });
    await vi.runAllTimersAsync();
    const item = state.statusItems[0]!;
    expect(item.visible).toBe(true);
    expect(item.text).toBe('$(pulse) P/F 20 · pH 7.32');
    expect(item.accessibilityInformation?.label).toBe('Pneumark timepoint tp 2: P/F 20, pH 7.32. Show trends.');
    expect(item.command).toBe('pneumark.showTrends');
    // It follows the cursor.
    moveCursor(editor, 3);
    await vi.runAllTimersAsync();
    expect(item.text).toBe('$(pulse) P/F 30 · pH 7.33');
  });

  it('hides at once for an editor of another language, and comes back for the note', async () => {
    const { send } = server();
    status = new TimepointStatus(() => send);
    const note = openEditor('/work/a.pneu', 'x\n\n@ 08:00\nabg 7.3/40/80/24', { line: 2 });
    await vi.runAllTimersAsync();
    const item = state.statusItems[0]!;
    expect(item.visible).toBe(true);
    openEditor('/work/README.md', '# readme', { languageId: 'markdown' });
    // No wait: a Markdown file must not show a note's figures even for a moment.
    expect(item.visible).toBe(false);
    activate(note);
    await vi.runAllTimersAsync();
    expect(item.visible).toBe(true);
  });

  it('drops an answer that comes after the user switched to another language', async () => {
    const { send } = server(500);
    status = new TimepointStatus(() => send);
    openEditor('/work/a.pneu', 'x\n\n@ 08:00\nabg 7.3/40/80/24', { line: 2 });
    await vi.advanceTimersByTimeAsync(130); // the request is on its way
    openEditor('/work/notes.txt', 'plain', { languageId: 'plaintext' });
    await vi.runAllTimersAsync();
    expect(state.statusItems[0]!.visible).toBe(false);
  });

  it('drops an answer for an earlier cursor position that comes after a later one', async () => {
    let calls = 0;
    const send = async <R>(_m: string, params: unknown): Promise<R> => {
      const p = params as SummaryParams;
      // The first answer is slow, the second fast.
      await new Promise((r) => setTimeout(r, calls++ === 0 ? 1000 : 10));
      return { label: `tp ${p.line}`, text: `line ${p.line}`, tooltip: '' } as R;
    };
    status = new TimepointStatus(() => send);
    const editor = openEditor('/work/a.pneu', 'a\nb\nc\nd\ne\nf', { line: 2 });
    await vi.advanceTimersByTimeAsync(130);
    moveCursor(editor, 5);
    await vi.runAllTimersAsync();
    expect(state.statusItems[0]!.text).toBe('$(pulse) line 5');
  });

  it('does not flicker while typing: no hide and show, and one request after a burst of keys', async () => {
    const { send, asked } = server(20);
    status = new TimepointStatus(() => send);
    const editor = openEditor('/work/a.pneu', 'x\n\n@ 08:00\nabg 7.3/40/80/24', { line: 3 });
    await vi.runAllTimersAsync();
    const item = state.statusItems[0]!;
    item.changes.length = 0;
    asked.length = 0;
    for (let i = 0; i < 10; i++) {
      moveCursor(editor, 3);
      status.noteAnalysed(editor.document.uri.toString());
      await vi.advanceTimersByTimeAsync(40);
    }
    await vi.runAllTimersAsync();
    expect(item.changes).toEqual([]);
    expect(asked.length).toBe(1);
  });

  it('hides when the cursor is before the first timepoint, and when the note is closed', async () => {
    const { send } = server();
    status = new TimepointStatus(() => send);
    const editor = openEditor('/work/a.pneu', 'x\n\n@ 08:00\nabg 7.3/40/80/24', { line: 3 });
    await vi.runAllTimersAsync();
    const item = state.statusItems[0]!;
    moveCursor(editor, 0);
    await vi.runAllTimersAsync();
    expect(item.visible).toBe(false);
    moveCursor(editor, 3);
    await vi.runAllTimersAsync();
    expect(item.visible).toBe(true);
    closeDocument(editor.document);
    expect(item.visible).toBe(false);
  });

  it('hides while the server is not running or fails', async () => {
    let running = false;
    const { send } = server();
    status = new TimepointStatus(() => (running ? send : null));
    openEditor('/work/a.pneu', 'x\n\n@ 08:00', { line: 2 });
    await vi.runAllTimersAsync();
    expect(state.statusItems[0]!.visible).toBe(false);
    running = true;
    status.schedule();
    await vi.runAllTimersAsync();
    expect(state.statusItems[0]!.visible).toBe(true);
  });
});

describe('what the item says', () => {
  it('keeps a $( in a label as text, not an icon', () => {
    expect(statusContent({ label: '$(alert) x', text: '$(alert) x', tooltip: '' }).text).toBe('$(pulse) \\$(alert) x');
  });

  it('shows characters that reorder or hide text in a label as escapes', () => {
    const content = statusContent({ label: 'a\u202Eexe.pdf', text: 'a\u202Eexe.pdf', tooltip: 'a\u202Eexe.pdf\nPaO2 71 mmHg' });
    expect(content.text).toBe('$(pulse) a\\u{202E}exe.pdf');
    expect(content.accessibleName).toBe('Pneumark timepoint a\\u{202E}exe.pdf. Show trends.');
    expect(content.tooltip.split('\n').slice(0, 2)).toEqual(['a\\u{202E}exe.pdf', 'PaO2 71 mmHg']);
  });

  it('says the driving pressure by its name and the mmHg of a P/F in kPa with its unit, to a screen reader', () => {
    const content = statusContent({ label: 'day 2 08:00', text: 'P/F 19.6 kPa (147) · pH 7.31 · ΔP 14 cmH2O', tooltip: '' });
    expect(content.text).toBe('$(pulse) P/F 19.6 kPa (147) · pH 7.31 · ΔP 14 cmH2O');
    expect(content.accessibleName).toBe('Pneumark timepoint day 2 08:00: P/F 19.6 kPa (147 mmHg), pH 7.31, driving pressure 14 cmH2O. Show trends.');
  });

  it('names a timepoint with no figures by its label alone', () => {
    expect(statusContent({ label: 'arrival', text: 'arrival', tooltip: 'arrival' }).accessibleName).toBe('Pneumark timepoint arrival. Show trends.');
  });
});
