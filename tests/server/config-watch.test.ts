// pneumark.config.json in a folder above the workspace: the server watches the folders the
// editor's watcher does not cover, lets them go when no note needs them, falls back to looking
// again on open and save where a folder cannot be watched, and analyses a note once per change
// however many times the change is reported. Unit tests of the pieces, then protocol-level tests
// of the bundled server over stdio.
import { chmodSync, copyFileSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, readlinkSync, realpathSync, renameSync, rmSync, statSync, symlinkSync, unlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, dirname, join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type { PublishDiagnosticsParams } from 'vscode-languageserver-protocol';
import { ProjectConfigs } from '../../server/src/node/project-config';
import { ConfigWatcher, filesToWatch, foldersToWatch, missingLinkTargetOf, type Watch, type WatchHandle } from '../../server/src/server/config-watch';
import { workspacePaths } from '../../server/src/server/server';
import { startClient, type LspClient } from './lsp-client';

const CONFIG = 'pneumark.config.json';
/** PaO2 65 on air: no finding with the default hypoxaemia threshold (60 mmHg), PN410 with one above 65. */
const NOTE = '@ 08:00\nabg ph 7.40, pco2 40, po2 65, fio2 0.21\n';
const posix = process.platform !== 'win32';

/** The hypoxaemia threshold PN410 names ("below 70 mmHg"), or null when PN410 is not reported. */
function threshold(p: PublishDiagnosticsParams): string | null {
  const found = p.diagnostics.find((d) => d.code === 'PN410');
  if (!found) return null;
  const message = typeof found.message === 'string' ? found.message : found.message.value;
  return (/below (\d+) mmHg/.exec(message)?.[1] ?? 'PN410 without a threshold');
}

function tempRoot(): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-watch-'));
  chmodSync(dir, 0o755);
  return dir;
}

describe.runIf(posix)('the folders watched for a note', () => {
  it('are those the lookup reads outside the workspace, up to the file that applies', () => {
    const ws = ['/a/b/ws'];
    expect(foldersToWatch('/a/b/ws/n.pneu', null, ws)).toEqual(['/a/b', '/a', '/']);
    expect(foldersToWatch('/a/b/ws/deep/n.pneu', '/a/b/pneumark.config.json', ws)).toEqual(['/a/b']);
    // A project file inside the workspace: the editor reports its changes, and nothing above it matters.
    expect(foldersToWatch('/a/b/ws/deep/n.pneu', '/a/b/ws/pneumark.config.json', ws)).toEqual([]);
    // Without a workspace, every folder read; a folder whose name starts like the workspace's is not inside it.
    expect(foldersToWatch('/a/b/n.pneu', '/a/pneumark.config.json', [])).toEqual(['/a/b', '/a']);
    expect(foldersToWatch('/a/b/wsx/n.pneu', null, ws)).toEqual(['/a/b/wsx', '/a/b', '/a', '/']);
    expect(foldersToWatch('/a/n.pneu', null, ['/'])).toEqual([]);
  });

  it('leave out workspace folders that are not files, and read the root URI when no folders are named', () => {
    expect(workspacePaths([{ uri: 'file:///a/ws/', name: 'ws' }, { uri: 'vscode-vfs://github/x', name: 'x' }], null)).toEqual(['/a/ws']);
    expect(workspacePaths(null, 'file:///a/root')).toEqual(['/a/root']);
    expect(workspacePaths(null, null)).toEqual([]);
  });
});

describe.runIf(posix)('the file a linked project file leads to', () => {
  it('is watched too, unless the editor reports it (a file of the project file\'s name in the workspace)', () => {
    const root = tempRoot();
    try {
      const ws = join(root, 'ws');
      const shared = join(root, 'shared');
      for (const dir of [ws, shared, join(ws, 'team')]) mkdirSync(dir);
      writeFileSync(join(shared, 'team.json'), '{}\n');
      writeFileSync(join(ws, 'team', CONFIG), '{}\n');
      symlinkSync(join(shared, 'team.json'), join(root, CONFIG));
      symlinkSync(join(ws, 'team', CONFIG), join(ws, CONFIG));
      // Through every link on the way.
      symlinkSync(join(root, CONFIG), join(shared, 'via.json'));
      const real = (p: string) => join(realpathSync(dirname(p)), basename(p));
      expect(filesToWatch(join(root, CONFIG), [ws])).toEqual([real(join(shared, 'team.json'))]);
      expect(filesToWatch(join(shared, 'via.json'), [ws])).toEqual([real(join(shared, 'team.json'))]);
      expect(filesToWatch(join(ws, CONFIG), [ws])).toEqual([]);
      expect(filesToWatch(join(ws, CONFIG), [])).toEqual([real(join(ws, 'team', CONFIG))]);
      // Not a link, a link to nothing, no file.
      expect(filesToWatch(join(shared, 'team.json'), [])).toEqual([]);
      symlinkSync(join(shared, 'gone.json'), join(shared, 'dangling.json'));
      expect(filesToWatch(join(shared, 'dangling.json'), [])).toEqual([]);
      expect(filesToWatch(null, [])).toEqual([]);
    } finally {
      rmSync(root, { recursive: true, force: true });
    }
  });

  it('that is not made yet is watched for where the lookup passes a link to nothing, up to the file that applies', () => {
    const root = tempRoot();
    try {
      const ws = join(root, 'ws');
      const notes = join(ws, 'notes');
      mkdirSync(notes, { recursive: true });
      mkdirSync(join(root, 'shared'));
      const real = (p: string) => join(realpathSync(dirname(p)), basename(p));
      const note = join(notes, 'n.pneu');
      // ws/pneumark.config.json -> ../shared/pneumark.config.json, not made yet: read from the link's folder.
      symlinkSync(join('..', 'shared', CONFIG), join(ws, CONFIG));
      expect(missingLinkTargetOf(join(ws, CONFIG))).toBe(real(join(root, 'shared', CONFIG)));
      expect(filesToWatch(null, [ws], note)).toEqual([real(join(root, 'shared', CONFIG))]);
      // Nothing for a link below the file that applies, nor above it.
      writeFileSync(join(notes, CONFIG), '{}\n');
      expect(filesToWatch(join(notes, CONFIG), [ws], note)).toEqual([]);
      unlinkSync(join(notes, CONFIG));
      writeFileSync(join(root, CONFIG), '{}\n');
      expect(filesToWatch(join(root, CONFIG), [ws], join(root, 'n.pneu'))).toEqual([]);
      // The editor reports a project file made in a workspace folder.
      unlinkSync(join(ws, CONFIG));
      symlinkSync(join('team', CONFIG), join(ws, CONFIG));
      expect(filesToWatch(null, [ws], note)).toEqual([]);
      expect(filesToWatch(null, [], note)).toEqual([real(join(ws, 'team'))]);
      // Through every link on the way; a folder not made yet: the first missing one, in the nearest that exists.
      unlinkSync(join(ws, CONFIG));
      symlinkSync(join(root, 'shared', 'via.json'), join(ws, CONFIG));
      symlinkSync(join('..', 'later', 'deeper', 'team.json'), join(root, 'shared', 'via.json'));
      expect(missingLinkTargetOf(join(ws, CONFIG))).toBe(real(join(root, 'later')));
      mkdirSync(join(root, 'later'));
      expect(missingLinkTargetOf(join(ws, CONFIG))).toBe(real(join(root, 'later', 'deeper')));
      mkdirSync(join(root, 'later', 'deeper'));
      expect(missingLinkTargetOf(join(ws, CONFIG))).toBe(real(join(root, 'later', 'deeper', 'team.json')));
      // Not a link, a link to a file, a loop of links, a link through a file: nothing.
      writeFileSync(join(root, 'later', 'deeper', 'team.json'), '{}\n');
      expect(missingLinkTargetOf(join(ws, CONFIG))).toBeNull();
      expect(missingLinkTargetOf(join(root, CONFIG))).toBeNull();
      expect(missingLinkTargetOf(join(root, 'nothing.json'))).toBeNull();
      symlinkSync(join(root, 'loop-b.json'), join(root, 'loop-a.json'));
      symlinkSync(join(root, 'loop-a.json'), join(root, 'loop-b.json'));
      expect(missingLinkTargetOf(join(root, 'loop-a.json'))).toBeNull();
      symlinkSync(join(root, CONFIG, 'x.json'), join(root, 'through-a-file.json'));
      expect(missingLinkTargetOf(join(root, 'through-a-file.json'))).toBeNull();
    } finally {
      rmSync(root, { recursive: true, force: true });
    }
  });
});

describe('the project file lookup', () => {
  it('goes on upward when the file found before is gone, and sees a nearer new one when asked to look afresh', () => {
    const root = tempRoot();
    const inner = join(root, 'inner');
    mkdirSync(inner);
    writeFileSync(join(root, CONFIG), '{ "gasUnit": "kPa" }');
    writeFileSync(join(inner, CONFIG), '{ "gasUnit": "mmHg" }');
    const configs = new ProjectConfigs();
    const note = join(inner, 'n.pneu');
    expect(configs.forPath(note)?.path).toBe(join(inner, CONFIG));
    unlinkSync(join(inner, CONFIG));
    expect(configs.forPath(note)?.config.settings).toEqual({ gasUnit: 'kPa' });
    writeFileSync(join(inner, CONFIG), '{ "gasUnit": "mmHg" }');
    // Remembered: the file further up, until the folders are looked at again.
    expect(configs.forPath(note)?.path).toBe(join(root, CONFIG));
    expect(configs.forPath(note, true)?.path).toBe(join(inner, CONFIG));
    rmSync(root, { recursive: true, force: true });
  });
});

/** A stand-in for fs.watch: records what is watched and lets a test fire events and errors. */
function fakeWatch(fail: Map<string, string> = new Map()) {
  const open = new Map<string, { listener: (event: string, filename: string | null) => void; error?: (e: Error) => void; handle: WatchHandle }>();
  const watch: Watch = (dir, listener) => {
    const code = fail.get(dir);
    if (code) throw Object.assign(new Error(`${code}: watch ${dir}`), { code });
    const entry: { listener: typeof listener; error?: (e: Error) => void; handle: WatchHandle } = {
      listener,
      handle: {
        close: () => { if (open.get(dir) === entry) open.delete(dir); },
        on: (_event, l) => { entry.error = l; },
      },
    };
    open.set(dir, entry);
    return entry.handle;
  };
  return { watch, open, fail };
}

describe('the config watcher', () => {
  afterEach(() => { vi.useRealTimers(); });

  it('watches a folder while some note needs it and lets it go when none does', () => {
    const fake = fakeWatch();
    const watcher = new ConfigWatcher(() => undefined, { watch: fake.watch, identity: () => 1 });
    // Whether a watch started (what was read there before it may be out of date).
    expect(watcher.need('a', ['/x/a', '/x'])).toBe(true);
    expect(watcher.need('b', ['/x'])).toBe(false);
    expect([...fake.open.keys()].sort()).toEqual(['/x', '/x/a']);
    watcher.release('a');
    expect([...fake.open.keys()]).toEqual(['/x']);
    // A note whose project file is now nearer needs fewer folders.
    watcher.need('b', []);
    expect(fake.open.size).toBe(0);
    expect(watcher.watching()).toEqual([]);
  });

  it('reports a burst of events about the project file once, and ignores other files', () => {
    vi.useFakeTimers();
    const fake = fakeWatch();
    let changes = 0;
    const watcher = new ConfigWatcher(() => { changes++; }, { watch: fake.watch, identity: () => 1, debounceMs: 100 });
    watcher.need('a', ['/x']);
    const fire = fake.open.get('/x')!.listener;
    fire('rename', 'other.txt');
    vi.advanceTimersByTime(500);
    expect(changes).toBe(0);
    fire('rename', CONFIG);
    fire('change', CONFIG);
    fire('rename', null);
    vi.advanceTimersByTime(99);
    expect(changes).toBe(0);
    vi.advanceTimersByTime(1);
    expect(changes).toBe(1);
    watcher.close();
  });

  it('counts a folder it cannot watch as unwatched, says so once, and tries again when a note needs it', () => {
    const fake = fakeWatch(new Map([['/full', 'ENOSPC']]));
    const logged: string[] = [];
    const watcher = new ConfigWatcher(() => undefined, { watch: fake.watch, identity: () => 1, log: (m) => logged.push(m) });
    watcher.need('a', ['/full', '/ok']);
    watcher.need('b', ['/ok']);
    expect(watcher.need('a', ['/full', '/ok'])).toBe(false);
    expect(watcher.watchesAll('a')).toBe(false);
    expect(watcher.watchesAll('b')).toBe(true);
    expect(watcher.unwatched()).toEqual(['a']);
    expect(logged).toEqual([expect.stringMatching(/^pneumark: cannot watch \/full for changes of pneumark\.config\.json \(ENOSPC\); a change there is noticed when a note below it is opened or saved\.$/)]);
    fake.fail.clear();
    expect(watcher.need('a', ['/full', '/ok'])).toBe(true);
    expect(watcher.unwatched()).toEqual([]);
    watcher.close();
  });

  it('watches the folder of the file a linked project file leads to, for that file only, and lets it go with the rest', () => {
    vi.useFakeTimers();
    const fake = fakeWatch();
    let changes = 0;
    const watcher = new ConfigWatcher(() => { changes++; }, { watch: fake.watch, identity: () => 1, debounceMs: 10 });
    expect(watcher.need('a', ['/x/a', '/x'], ['/shared/team.json'])).toBe(true);
    expect([...fake.open.keys()].sort()).toEqual(['/shared', '/x', '/x/a']);
    const shared = fake.open.get('/shared')!.listener;
    shared('change', 'other.json');
    shared('rename', CONFIG);
    vi.advanceTimersByTime(50);
    expect(changes).toBe(0);
    shared('change', 'team.json');
    vi.advanceTimersByTime(10);
    expect(changes).toBe(1);
    // Another note reads the project file of that folder: events about each file count, for as long as one note reads it.
    watcher.need('b', ['/shared']);
    shared('rename', CONFIG);
    vi.advanceTimersByTime(10);
    expect(changes).toBe(2);
    watcher.release('b');
    shared('rename', CONFIG);
    vi.advanceTimersByTime(10);
    expect(changes).toBe(2);
    // The link now leads elsewhere: the old folder is let go; closing the note lets every one go.
    watcher.need('a', ['/x/a', '/x'], ['/team/settings.json']);
    expect([...fake.open.keys()].sort()).toEqual(['/team', '/x', '/x/a']);
    watcher.release('a');
    expect(fake.open.size).toBe(0);
    watcher.close();
  });

  it('treats a watch that fails, or a folder removed under it, as lost and reports a possible change', () => {
    vi.useFakeTimers();
    const fake = fakeWatch();
    let changes = 0;
    const identity = new Map([['/x', 1], ['/y', 2]]);
    const watcher = new ConfigWatcher(() => { changes++; }, { watch: fake.watch, identity: (d) => identity.get(d) ?? null, debounceMs: 10 });
    watcher.need('a', ['/x', '/y']);
    fake.open.get('/x')!.error!(Object.assign(new Error('EACCES'), { code: 'EACCES' }));
    expect(fake.open.has('/x')).toBe(false);
    expect(watcher.watchesAll('a')).toBe(false);
    vi.advanceTimersByTime(10);
    expect(changes).toBe(1);
    // An event named after the folder itself, while the folder is still there: nothing lost.
    fake.open.get('/y')!.listener('rename', 'y');
    expect(fake.open.has('/y')).toBe(true);
    identity.delete('/y');
    fake.open.get('/y')!.listener('rename', 'y');
    expect(fake.open.has('/y')).toBe(false);
    vi.advanceTimersByTime(10);
    expect(changes).toBe(2);
    watcher.close();
  });
});

/** The inodes a process watches with inotify (Linux: /proc/PID/fdinfo). */
/** A fresh folder holding a workspace folder `ws`, with a server started on that workspace; all let go after `body`. */
async function inWorkspace(body: (root: string, ws: string, client: LspClient) => Promise<void>): Promise<void> {
  const root = tempRoot();
  const ws = join(root, 'ws');
  mkdirSync(ws);
  const client = await startClient({}, { workspaceFolders: [ws] });
  try {
    await body(root, ws, client);
  } finally {
    await client.close();
    rmSync(root, { recursive: true, force: true });
  }
}

/** Closes a note and waits until the server clears its diagnostics, which it does after letting the note's watches go. */
async function closeNote(client: LspClient, uri: string): Promise<void> {
  const count = client.published.length;
  await client.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
  await client.diagnostics(uri, (p) => client.published.indexOf(p) >= count);
}

function watchedInodes(pid: number): number[] {
  const inodes: number[] = [];
  for (const fd of readdirSync(`/proc/${pid}/fd`)) {
    let target: string;
    try {
      target = readlinkSync(`/proc/${pid}/fd/${fd}`);
    } catch {
      continue;
    }
    if (target !== 'anon_inode:inotify') continue;
    for (const m of readFileSync(`/proc/${pid}/fdinfo/${fd}`, 'utf8').matchAll(/^inotify wd:\S+ ino:([0-9a-f]+)/gm)) inodes.push(parseInt(m[1]!, 16));
  }
  return inodes.sort((a, b) => a - b);
}

describe.runIf(posix)('a project file above the workspace, over the protocol', () => {
  let client: LspClient;
  let root: string;
  let ws: string;
  beforeAll(async () => {
    root = tempRoot();
    ws = join(root, 'ws');
    mkdirSync(ws);
    client = await startClient({}, { workspaceFolders: [ws] });
  });
  afterAll(async () => {
    await client?.close();
    rmSync(root, { recursive: true, force: true });
  });

  /**
   * Diagnostics for `uri` published after the first `count` ones, whose PN410 names `below` (null:
   * no PN410). Waits 15 s at most: a failure is reported, and the folders removed, within the
   * test's own time limit (20 s).
   */
  const diagnosticsWith = (uri: string, count: number, below: string | null) =>
    client.diagnostics(uri, (p) => client.published.indexOf(p) >= count && threshold(p) === below, 15000);

  it('is noticed when made, changed, renamed into place and deleted, with no word from the client', async () => {
    const uri = client.open(join(ws, 'a.pneu'), NOTE);
    expect(threshold(await client.diagnostics(uri))).toBeNull();
    const file = join(root, CONFIG);
    let count = client.published.length;
    writeFileSync(file, '{ "hypoxaemiaBelowMmhg": 70 }\n');
    await diagnosticsWith(uri, count, '70');
    count = client.published.length;
    writeFileSync(file, '{ "hypoxaemiaBelowMmhg": 75 }\n');
    await diagnosticsWith(uri, count, '75');
    // An editor's safe save: a new file renamed over the old one.
    count = client.published.length;
    writeFileSync(join(root, `.${CONFIG}.tmp`), '{ "hypoxaemiaBelowMmhg": 80 }\n');
    renameSync(join(root, `.${CONFIG}.tmp`), file);
    await diagnosticsWith(uri, count, '80');
    count = client.published.length;
    unlinkSync(file);
    await diagnosticsWith(uri, count, null);
  });

  it('reports an invalid file on the file itself, the defaults apply, and the report goes when the file does', async () => {
    const uri = client.open(join(ws, 'b.pneu'), NOTE);
    expect(threshold(await client.diagnostics(uri))).toBeNull();
    const file = join(root, CONFIG);
    const configUri = pathToFileURL(file).toString();
    let count = client.published.length;
    writeFileSync(file, '{ "hypoxaemiaBelowMmhg": 70 }\n');
    await diagnosticsWith(uri, count, '70');
    count = client.published.length;
    writeFileSync(file, '{ "hypoxaemiaBelowMmhg": 70, }\n');
    const problem = await client.diagnostics(configUri, (p) => client.published.indexOf(p) >= count && p.diagnostics.length > 0, 15000);
    expect(problem.diagnostics.map((d) => [d.message, d.range.start])).toEqual([
      ['pneumark.config.json is not valid JSON (a comma cannot come just before `}`); Pneumark uses its defaults.', { line: 0, character: 29 }],
    ]);
    await diagnosticsWith(uri, count, null);
    count = client.published.length;
    unlinkSync(file);
    const cleared = await client.diagnostics(configUri, (p) => client.published.indexOf(p) >= count, 15000);
    expect(cleared.diagnostics).toEqual([]);
  });

  it('keeps the problems of an invalid file a nearer one now stands in for, saying that the notes open read the nearer one', async () => {
    const far = join(root, 'far');
    const near = join(far, 'near');
    mkdirSync(near, { recursive: true });
    const invalid = join(far, CONFIG);
    const invalidUri = pathToFileURL(invalid).toString();
    writeFileSync(invalid, '{ "hypoxaemiaBelowMmhg": 70, }\n');
    const messages = (p: PublishDiagnosticsParams) => p.diagnostics.map((d) => (typeof d.message === 'string' ? d.message : d.message.value));
    const problemsSaying = (count: number, text: string) => client.diagnostics(invalidUri, (p) => client.published.indexOf(p) >= count && messages(p).some((m) => m.includes(text)), 15000);
    let count = client.published.length;
    const uri = client.open(join(near, 'g.pneu'), NOTE);
    // The note reads the invalid file: the defaults apply to it, and the file says so.
    expect(threshold(await client.diagnostics(uri))).toBeNull();
    expect(messages(await problemsSaying(count, 'uses its defaults'))).toEqual([
      'pneumark.config.json is not valid JSON (a comma cannot come just before `}`); Pneumark uses its defaults.',
    ]);
    // A nearer file is made: the note reads it; the far file is still invalid, and says the notes open read the nearer one.
    count = client.published.length;
    writeFileSync(join(near, CONFIG), '{ "hypoxaemiaBelowMmhg": 72 }\n');
    await diagnosticsWith(uri, count, '72');
    expect(messages(await problemsSaying(count, 'nearer'))).toEqual([
      'pneumark.config.json is not valid JSON (a comma cannot come just before `}`); the open notes below it read a nearer pneumark.config.json, and a note that reads this one gets Pneumark\'s defaults until it is fixed.',
    ]);
    // Gone again: the note reads the far file, and its problem says again that the defaults apply.
    count = client.published.length;
    unlinkSync(join(near, CONFIG));
    await diagnosticsWith(uri, count, null);
    expect(messages(await problemsSaying(count, 'uses its defaults'))).toEqual([
      'pneumark.config.json is not valid JSON (a comma cannot come just before `}`); Pneumark uses its defaults.',
    ]);
    await client.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
    unlinkSync(invalid);
  });

  it('that is a link to a file elsewhere is noticed when that file is changed through its own path', async () => {
    const shared = join(root, 'shared');
    mkdirSync(shared);
    const target = join(shared, 'team.json');
    writeFileSync(target, '{ "hypoxaemiaBelowMmhg": 70 }\n');
    const link = join(root, CONFIG);
    symlinkSync(target, link);
    try {
      const uri = client.open(join(ws, 'f.pneu'), NOTE);
      expect(threshold(await client.diagnostics(uri))).toBe('70');
      let count = client.published.length;
      writeFileSync(realpathSync(target), '{ "hypoxaemiaBelowMmhg": 75 }\n');
      await diagnosticsWith(uri, count, '75');
      // A safe save of the shared file: a new file renamed over it.
      count = client.published.length;
      writeFileSync(join(shared, '.team.json.tmp'), '{ "hypoxaemiaBelowMmhg": 80 }\n');
      renameSync(join(shared, '.team.json.tmp'), target);
      await diagnosticsWith(uri, count, '80');
      await client.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
    } finally {
      unlinkSync(link);
    }
  });

  it('that is a link to a file not made yet is read once that file is made', async () => {
    // ln -s ../shared/pneumark.config.json pneumark.config.json, in the workspace, before ../shared/pneumark.config.json exists.
    const shared = join(root, 'later-shared');
    mkdirSync(shared);
    const link = join(ws, CONFIG);
    symlinkSync(join('..', 'later-shared', CONFIG), link);
    try {
      const uri = client.open(join(ws, 'h.pneu'), NOTE);
      expect(threshold(await client.diagnostics(uri))).toBeNull();
      let count = client.published.length;
      writeFileSync(join(shared, CONFIG), '{ "hypoxaemiaBelowMmhg": 70 }\n');
      await diagnosticsWith(uri, count, '70');
      // Then watched as any link's file is.
      count = client.published.length;
      writeFileSync(join(shared, CONFIG), '{ "hypoxaemiaBelowMmhg": 75 }\n');
      await diagnosticsWith(uri, count, '75');
      await closeNote(client, uri);
    } finally {
      unlinkSync(link);
      rmSync(shared, { recursive: true, force: true });
    }
  });

  it('that is a link into folders not made yet is read once they and the file are made', async () => {
    const link = join(ws, CONFIG);
    symlinkSync(join('..', 'later', 'team', 'settings.json'), link);
    try {
      const uri = client.open(join(ws, 'i.pneu'), NOTE);
      expect(threshold(await client.diagnostics(uri))).toBeNull();
      const count = client.published.length;
      mkdirSync(join(root, 'later', 'team'), { recursive: true });
      writeFileSync(join(root, 'later', 'team', 'settings.json'), '{ "hypoxaemiaBelowMmhg": 72 }\n');
      await diagnosticsWith(uri, count, '72');
      await closeNote(client, uri);
    } finally {
      unlinkSync(link);
      rmSync(join(root, 'later'), { recursive: true, force: true });
    }
  });

  it('analyses a note once for a change both the client and a watch report, inside the workspace or not', async () => {
    const inside = join(ws, 'inside');
    const outside = join(root, 'outside');
    const other = join(root, 'other');
    for (const dir of [inside, outside, other]) mkdirSync(dir);
    const insideUri = client.open(join(inside, 'c.pneu'), NOTE);
    const outsideUri = client.open(join(outside, 'd.pneu'), NOTE);
    const otherUri = client.open(join(other, 'e.pneu'), NOTE);
    for (const uri of [insideUri, outsideUri, otherUri]) await client.diagnostics(uri);
    const analyses = (uri: string) => client.analysed.filter((a) => a.uri === uri).length;
    const before = { inside: analyses(insideUri), outside: analyses(outsideUri) };
    let count = client.published.length;
    // A client that watches every folder reports both files, as the server's own watch of the folder outside does.
    writeFileSync(join(inside, CONFIG), '{ "hypoxaemiaBelowMmhg": 70 }\n');
    writeFileSync(join(outside, CONFIG), '{ "hypoxaemiaBelowMmhg": 72 }\n');
    await client.connection.sendNotification('workspace/didChangeWatchedFiles', {
      changes: [{ uri: pathToFileURL(join(inside, CONFIG)).toString(), type: 1 }, { uri: pathToFileURL(join(outside, CONFIG)).toString(), type: 1 }],
    });
    await diagnosticsWith(insideUri, count, '70');
    await diagnosticsWith(outsideUri, count, '72');
    // Then a change the server can only learn of by its watch: once it is handled, so are the events before it.
    count = client.published.length;
    writeFileSync(join(other, CONFIG), '{ "hypoxaemiaBelowMmhg": 74 }\n');
    await diagnosticsWith(otherUri, count, '74');
    expect({ inside: analyses(insideUri) - before.inside, outside: analyses(outsideUri) - before.outside }).toEqual({ inside: 1, outside: 1 });
    for (const dir of [inside, outside, other]) unlinkSync(join(dir, CONFIG));
  });
});

describe.runIf(posix)('a project file inside the workspace', () => {
  it('is watched by the client when it can be told to (it is registered with it)', async () => {
    const root = tempRoot();
    const client = await startClient({}, { workspaceFolders: [root] });
    try {
      await expect.poll(() => client.registrations.find((r) => r.method === 'workspace/didChangeWatchedFiles'), { timeout: 5000 })
        .toMatchObject({ registerOptions: { watchers: [{ globPattern: '**/pneumark.config.json' }] } });
    } finally {
      await client.close();
      rmSync(root, { recursive: true, force: true });
    }
  });

  it('is watched by the server when the client reports no file changes (Neovim 0.7), and registered with no one', async () => {
    const root = tempRoot();
    const ws = join(root, 'ws');
    mkdirSync(join(ws, 'notes'), { recursive: true });
    const client = await startClient({}, { workspaceFolders: [ws], watchFiles: false });
    try {
      const uri = client.open(join(ws, 'notes', 'a.pneu'), NOTE);
      expect(threshold(await client.diagnostics(uri))).toBeNull();
      let count = client.published.length;
      writeFileSync(join(ws, CONFIG), '{ "hypoxaemiaBelowMmhg": 70 }\n');
      await client.diagnostics(uri, (p) => client.published.indexOf(p) >= count && threshold(p) === '70', 15000);
      count = client.published.length;
      writeFileSync(join(ws, 'notes', CONFIG), '{ "hypoxaemiaBelowMmhg": 72 }\n');
      await client.diagnostics(uri, (p) => client.published.indexOf(p) >= count && threshold(p) === '72', 15000);
      expect(client.registrations.map((r) => r.method)).not.toContain('workspace/didChangeWatchedFiles');
    } finally {
      await client.close();
      rmSync(root, { recursive: true, force: true });
    }
  });
});

describe.runIf(process.platform === 'linux')('the watches the server holds (Linux: /proc)', () => {
  it('are on the folders above the workspace only, follow the workspace folders, and are all let go when the note is closed', async () => {
    await inWorkspace(async (root, ws, client) => {
      const pid = client.process.pid!;
      const uri = client.open(join(ws, 'a.pneu'), NOTE);
      await client.diagnostics(uri);
      const above: number[] = [];
      for (let dir = root; ; dir = resolve(dir, '..')) {
        above.push(statSync(dir).ino);
        if (dir === resolve(dir, '..')) break;
      }
      expect(watchedInodes(pid)).toEqual([...new Set(above)].sort((a, b) => a - b));
      expect(watchedInodes(pid)).not.toContain(statSync(ws).ino);
      // A workspace folder added above: the editor watches it now, and the server lets it go.
      await client.connection.sendNotification('workspace/didChangeWorkspaceFolders', { event: { added: [{ uri: pathToFileURL(root).toString(), name: 'root' }], removed: [] } });
      await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 1, character: 5 } });
      expect(watchedInodes(pid)).toEqual([...new Set(above.slice(1))].sort((a, b) => a - b));
      await client.connection.sendNotification('workspace/didChangeWorkspaceFolders', { event: { added: [], removed: [{ uri: pathToFileURL(root).toString(), name: 'root' }] } });
      await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 1, character: 5 } });
      expect(watchedInodes(pid)).toContain(statSync(root).ino);
      await closeNote(client, uri);
      expect(watchedInodes(pid)).toEqual([]);
    });
  });
  it('include the folder of the file a linked project file leads to, let go with the rest when the note is closed', async () => {
    const root = tempRoot();
    const ws = join(root, 'ws');
    const shared = join(root, 'shared');
    for (const dir of [ws, shared]) mkdirSync(dir);
    writeFileSync(join(shared, 'team.json'), '{ "hypoxaemiaBelowMmhg": 70 }\n');
    symlinkSync(join(shared, 'team.json'), join(root, CONFIG));
    const client = await startClient({}, { workspaceFolders: [ws] });
    try {
      const pid = client.process.pid!;
      const uri = client.open(join(ws, 'a.pneu'), NOTE);
      expect(threshold(await client.diagnostics(uri))).toBe('70');
      expect(watchedInodes(pid)).toEqual([statSync(root).ino, statSync(shared).ino].sort((a, b) => a - b));
      await closeNote(client, uri);
      expect(watchedInodes(pid)).toEqual([]);
    } finally {
      await client.close();
      rmSync(root, { recursive: true, force: true });
    }
  });
});

describe.runIf(process.platform === 'linux')('the watches for a linked project file that leads to nothing yet (Linux: /proc)', () => {
  it('are on the folder it would lead to, and let go with the rest when the note is closed', async () => {
    await inWorkspace(async (root, ws, client) => {
      const shared = join(root, 'shared');
      mkdirSync(shared);
      symlinkSync(join('..', 'shared', CONFIG), join(ws, CONFIG));
      const pid = client.process.pid!;
      const uri = client.open(join(ws, 'a.pneu'), NOTE);
      await client.diagnostics(uri);
      expect(watchedInodes(pid)).toContain(statSync(shared).ino);
      await closeNote(client, uri);
      expect(watchedInodes(pid)).toEqual([]);
    });
  });
});

describe.runIf(process.platform === 'linux')('a note closed while its settings are asked for', () => {
  it('leaves no watch behind, and the note opened again at once is analysed', async () => {
    await inWorkspace(async (root, ws, client) => {
      const pid = client.process.pid!;
      // Closed before the client has answered the request for its settings (sent on opening).
      const uri = client.open(join(ws, 'a.pneu'), NOTE);
      await client.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
      const again = join(ws, 'b.pneu');
      const b = client.open(again, NOTE);
      await client.connection.sendNotification('textDocument/didClose', { textDocument: { uri: b } });
      client.open(again, '@ 08:00\nvitals spo2 104\n', 2);
      expect((await client.diagnostics(b, (p) => p.version === 2)).diagnostics.map((d) => d.code)).toEqual(['PN306']);
      await closeNote(client, b);
      expect(watchedInodes(pid)).toEqual([]);
      expect(client.published.filter((p) => p.uri === uri && p.diagnostics.length > 0)).toEqual([]);
    });
  });
});

describe.runIf(process.platform === 'linux')('a folder the server cannot watch', () => {
  it('is looked at again when a note is saved, and the server says once that it cannot watch it', async () => {
    // Permissions do not hold for root: as root the server runs as the unprivileged user `nobody`
    // (util-linux's setpriv), from a copy of the bundle where that user may read it.
    const root = tempRoot();
    let server: { command: string; args: string[] } | undefined;
    if (process.getuid?.() === 0) {
      const bin = join(root, 'bin');
      mkdirSync(bin, { mode: 0o755 });
      copyFileSync('dist/server.js', join(bin, 'server.js'));
      server = { command: 'setpriv', args: ['--reuid=65534', '--regid=65534', '--clear-groups', process.execPath, join(bin, 'server.js')] };
    }
    // A folder that may be passed through but not read: a watch of it is refused (EACCES).
    const locked = join(root, 'locked');
    mkdirSync(locked);
    const ws = join(locked, 'ws');
    mkdirSync(ws, { mode: 0o755 });
    chmodSync(locked, 0o333);
    const client = await startClient({}, { workspaceFolders: [ws], ...(server ? { server } : {}) });
    try {
      const uri = client.open(join(ws, 'a.pneu'), NOTE);
      expect(threshold(await client.diagnostics(uri))).toBeNull();
      await client.message((m) => m.message.includes(`cannot watch ${locked} for changes of pneumark.config.json (EACCES)`));
      const count = client.published.length;
      writeFileSync(join(locked, CONFIG), '{ "hypoxaemiaBelowMmhg": 70 }\n', { mode: 0o644 });
      client.save(uri);
      await client.diagnostics(uri, (p) => client.published.indexOf(p) >= count && threshold(p) === '70', 15000);
      expect(client.messages.filter((m) => m.message.includes('cannot watch'))).toHaveLength(1);
    } finally {
      await client.close();
      chmodSync(locked, 0o755);
      rmSync(root, { recursive: true, force: true });
    }
  });
});
