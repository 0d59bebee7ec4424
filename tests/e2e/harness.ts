/**
 * End-to-end harness: a real VS Code workbench (code-server 4.100.3) with the packaged .vsix
 * installed, driven by headless Chromium through playwright-core. Everything runs on loopback;
 * nothing is fetched from the internet. Waits are on selectors with bounded timeouts.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { cpSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';

export const OUTPUT = join(process.cwd(), 'test-output', 'e2e');

export const CHROMIUM_FLAGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'];

export interface Workbench {
  readonly page: Page;
  readonly workspace: string;
  close(): Promise<void>;
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.unref();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

async function waitForHttp(url: string, timeoutMs: number): Promise<void> {
  const until = Date.now() + timeoutMs;
  let last: unknown = null;
  while (Date.now() < until) {
    try {
      const response = await fetch(url);
      if (response.ok) return;
      last = response.status;
    } catch (error) {
      last = error;
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`code-server did not answer at ${url} within ${timeoutMs} ms (${String(last)})`);
}

export async function startWorkbench(vsix: string): Promise<Workbench> {
  mkdirSync(OUTPUT, { recursive: true });
  const codeServer = execFileSync('bash', [join(process.cwd(), 'tests/e2e/setup-code-server.sh')], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] }).trim().split('\n').pop()!;
  const root = mkdtempSync(join(tmpdir(), 'pneumark-e2e-'));
  const userData = join(root, 'user-data');
  const extensions = join(root, 'extensions');
  const workspace = join(root, 'notes');
  mkdirSync(join(userData, 'User'), { recursive: true });
  cpSync(join(process.cwd(), 'samples'), workspace, { recursive: true });
  writeFileSync(join(userData, 'User', 'settings.json'), JSON.stringify({
    'workbench.startupEditor': 'none',
    'workbench.tips.enabled': false,
    'workbench.enableExperiments': false,
    'security.workspace.trust.enabled': false,
    'telemetry.telemetryLevel': 'off',
    'extensions.autoCheckUpdates': false,
    'extensions.autoUpdate': false,
    'update.mode': 'none',
    'editor.inlayHints.enabled': 'on',
    'editor.hover.delay': 100,
    'workbench.colorTheme': 'Default Dark Modern',
  }, null, 2));
  execFileSync(codeServer, ['--user-data-dir', userData, '--extensions-dir', extensions, '--install-extension', vsix, '--force'], { stdio: 'pipe' });
  const port = await freePort();
  const server: ChildProcess = spawn(codeServer, [
    '--auth', 'none', '--bind-addr', `127.0.0.1:${port}`, '--disable-telemetry', '--disable-update-check', '--disable-workspace-trust',
    '--user-data-dir', userData, '--extensions-dir', extensions, workspace,
  ], { stdio: 'pipe', env: { ...process.env, PNEUMARK_E2E: '1' } });
  let serverLog = '';
  server.stdout?.on('data', (d: Buffer) => { serverLog += d.toString(); });
  server.stderr?.on('data', (d: Buffer) => { serverLog += d.toString(); });
  try {
    await waitForHttp(`http://127.0.0.1:${port}/healthz`, 60000);
  } catch (error) {
    server.kill();
    throw new Error(`${error instanceof Error ? error.message : String(error)}\n${serverLog}`);
  }
  const browser: Browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_FLAGS, headless: true });
  const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
  await page.goto(`http://127.0.0.1:${port}/?folder=${encodeURIComponent(workspace)}`);
  await page.locator('.monaco-workbench').waitFor({ timeout: 60000 });
  return {
    page,
    workspace,
    async close() {
      await browser.close().catch(() => undefined);
      server.kill();
      writeFileSync(join(OUTPUT, 'code-server.log'), serverLog);
    },
  };
}

/** Opens a file of the workspace by double-clicking it in the Explorer, and waits for its editor. */
export async function openFile(page: Page, name: string): Promise<void> {
  try {
    const row = page.locator(`.explorer-folders-view .monaco-list-row[aria-label="${name}"]`).first();
    await row.waitFor({ timeout: 30000 });
    await row.dblclick();
    await page.locator(`.tab.active[aria-label*="${name}"]`).first().waitFor({ timeout: 15000 });
    await page.locator('.editor-instance .monaco-editor .view-lines').first().waitFor({ timeout: 15000 });
  } catch (error) {
    await screenshot(page, `failed-open-${name}`);
    throw error;
  }
}

/** Puts the keyboard focus back in the editor area (after a panel or widget had it). */
export async function focusEditorArea(page: Page): Promise<void> {
  await page.keyboard.press('Escape');
  const editor = page.locator('.editor-instance .monaco-editor .view-lines').first();
  if (await editor.count() > 0) await editor.click({ position: { x: 5, y: 5 } }).catch(() => undefined);
}

/** Runs a command from the command palette by its exact title. */
export async function runCommand(page: Page, title: string): Promise<void> {
  await page.keyboard.press('F1');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor({ timeout: 15000 });
  await input.fill(`>${title}`);
  const exact = new RegExp(`^${title.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}$`);
  const row = page.locator('.quick-input-list .monaco-list-row').filter({ has: page.locator('.label-name', { hasText: exact }) }).first();
  await row.waitFor({ timeout: 15000 });
  await row.click();
}

/** Moves the cursor with Go to Line. */
export async function goTo(page: Page, line: number, column: number): Promise<void> {
  await page.keyboard.press('Control+P');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor({ timeout: 15000 });
  await input.fill(`:${line}:${column}`);
  await page.locator('.quick-input-list .monaco-list-row').first().waitFor({ timeout: 15000 });
  await page.keyboard.press('Enter');
  await page.locator('.quick-input-widget').waitFor({ state: 'hidden', timeout: 15000 });
}

/** Switches the colour theme with the theme picker, as a user would. */
export async function setTheme(page: Page, theme: string): Promise<void> {
  await runCommand(page, 'Preferences: Color Theme');
  const input = page.locator('.quick-input-widget input');
  await input.fill(theme);
  const row = page.locator('.quick-input-list .monaco-list-row').filter({ has: page.locator('.label-name', { hasText: new RegExp(`^${theme}$`) }) }).first();
  try {
    await row.waitFor({ timeout: 15000 });
  } catch (error) {
    await screenshot(page, `failed-theme-${theme}`);
    throw error;
  }
  await row.click();
  const kind = theme.includes('High Contrast') ? 'hc-black' : theme.includes('Light') ? 'vs' : 'vs-dark';
  await page.locator(`.monaco-workbench.${kind}`).waitFor({ timeout: 30000 });
}

export async function screenshot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: join(OUTPUT, `${name}.png`) });
}
