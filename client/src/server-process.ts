/**
 * The language server's process as the extension looks after it: what happens when it stops
 * (restarted, with one clear message after repeated crashes), how a restart on request recovers
 * from any state, and the channel that the `pneumark.trace.server` setting writes to.
 */
import * as vscode from 'vscode';
import { CloseAction, ErrorAction, type CloseHandlerResult, type ErrorHandler, type ErrorHandlerResult } from 'vscode-languageclient/node';

/** Crashes within this window count as "repeated". */
export const CRASH_WINDOW_MS = 3 * 60 * 1000;
/** Restarts allowed within the window; the next crash stops the server until a restart on request. */
export const MAX_RESTARTS = 4;

export interface CrashHandler extends ErrorHandler {
  /** Forgets past crashes (a restart on request starts afresh). */
  reset(): void;
}

/**
 * Restarts a server that stopped on its own, and says so: nothing for a first crash (it is
 * logged), a warning after a second one within three minutes, and after the fifth an error
 * with a Restart button, the server left stopped. The language client's own notifications are
 * marked handled so that the user sees one message, not two. `restarting` is told each time the
 * server is to be started again, before the language client starts it.
 */
export function crashHandler(output: vscode.LogOutputChannel, now: () => number = Date.now, restarting: () => void = () => undefined): CrashHandler {
  const crashes: number[] = [];
  return {
    reset: () => { crashes.length = 0; },
    error: (): ErrorHandlerResult => ({ action: ErrorAction.Continue, handled: true }),
    closed: (): CloseHandlerResult => {
      const time = now();
      crashes.push(time);
      while (crashes.length > 0 && time - crashes[0]! > CRASH_WINDOW_MS) crashes.shift();
      const count = crashes.length;
      output.warn(`the language server stopped (${count === 1 ? 'once' : `${count} times`} in the last 3 minutes)`);
      if (count > MAX_RESTARTS) {
        void vscode.window.showErrorMessage(
          `The Pneumark language server stopped ${count} times in 3 minutes and was not restarted: notes are not checked until it is. The Pneumark output says why it stopped.`,
          'Restart', 'Show Output',
        ).then((choice) => {
          if (choice === 'Restart') void vscode.commands.executeCommand('pneumark.restartServer');
          if (choice === 'Show Output') output.show();
        });
        return { action: CloseAction.DoNotRestart, handled: true, message: 'the language server stopped repeatedly and was not restarted; run "Pneumark: Restart Language Server" to start it again' };
      }
      if (count > 1) void vscode.window.showWarningMessage(`The Pneumark language server stopped (${count} times in 3 minutes) and was restarted.`);
      restarting();
      return { action: CloseAction.Restart, handled: true, message: 'the language server was restarted' };
    },
  };
}

/** The part of the language client a restart needs. */
export interface Restartable {
  restart(): Promise<void>;
  start(): Promise<void>;
}

/**
 * Restarts the server on request, from whatever state it is in: running, stopped after repeated
 * crashes, or failed while starting (where the client's own restart refuses to stop it first).
 * Returns whether it runs again; a failure is logged and shown with the way to the output.
 */
export async function restartServer(client: Restartable | null, crashes: CrashHandler, output: vscode.LogOutputChannel): Promise<boolean> {
  if (!client) return false;
  crashes.reset();
  output.info('restarting the language server on request');
  try {
    await client.restart();
    return true;
  } catch (first) {
    try {
      await client.start();
      return true;
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error ?? first);
      output.error(`the language server could not be started: ${reason}`);
      const choice = await vscode.window.showErrorMessage(`The Pneumark language server could not be started: ${reason}`, 'Show Output');
      if (choice === 'Show Output') output.show();
      return false;
    }
  }
}

/**
 * The channel the language client writes its trace of messages to. The client traces only
 * while its trace channel's log level is Trace, whatever `pneumark.trace.server` says, and
 * writes at that level, which the output hides by default: so the setting alone showed nothing.
 * This channel reports the Trace level while the setting is `messages` or `verbose` (or while
 * the Pneumark output itself is set to Trace), and writes each traced message as an ordinary
 * line of the Pneumark output.
 */
export function traceChannel(output: vscode.LogOutputChannel): vscode.LogOutputChannel & vscode.Disposable {
  const changed = new vscode.EventEmitter<vscode.LogLevel>();
  const setting = (): string => vscode.workspace.getConfiguration('pneumark').get<string>('trace.server', 'off');
  const level = (): vscode.LogLevel => (setting() !== 'off' ? vscode.LogLevel.Trace : output.logLevel);
  let last = level();
  const update = () => {
    const now = level();
    if (now !== last) {
      last = now;
      changed.fire(now);
    }
  };
  const listeners = [
    vscode.workspace.onDidChangeConfiguration((e) => { if (e.affectsConfiguration('pneumark.trace.server')) update(); }),
    output.onDidChangeLogLevel(() => update()),
  ];
  const write = (message: string) => output.appendLine(message);
  return {
    get name() { return output.name; },
    get logLevel() { return last; },
    onDidChangeLogLevel: changed.event,
    trace: write,
    debug: write,
    info: write,
    warn: (message: string) => output.warn(message),
    error: (message: string | Error) => output.error(message),
    append: (value: string) => output.append(value),
    appendLine: write,
    replace: (value: string) => output.replace(value),
    clear: () => output.clear(),
    show: (a?: unknown, b?: boolean) => (typeof a === 'boolean' ? output.show(a) : output.show(b)),
    hide: () => output.hide(),
    dispose: () => {
      for (const l of listeners) l.dispose();
      changed.dispose();
    },
  };
}

/**
 * Passes on to the server only the settings changes that concern it. The server registers for
 * `workspace/didChangeConfiguration` without naming a section, so the language client sent it a
 * notification for every change of any setting (a font size, another extension's option), and the
 * server asked again for the settings of every open note and analysed each one again. Its
 * listener notes whether a change touches `pneumark.*`; the middleware lets only those through.
 */
export function pneumarkSettingsOnly(): vscode.Disposable & {
  readonly middleware: (sections: string[] | undefined, next: (sections: string[] | undefined) => Promise<void>) => Promise<void>;
} {
  let concernsPneumark = true;
  const listener = vscode.workspace.onDidChangeConfiguration((e) => { concernsPneumark = e.affectsConfiguration('pneumark'); });
  return {
    middleware: async (sections, next) => {
      // VS Code calls every listener of one change before any promise job runs: after this
      // wait the flag is the one of this change, whichever listener was registered first.
      await Promise.resolve();
      if (!concernsPneumark) return;
      await next(sections);
    },
    dispose: () => listener.dispose(),
  };
}
