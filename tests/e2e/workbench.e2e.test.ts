// The extension in a real VS Code workbench (code-server) in a real browser (headless Chromium).
// Every assertion reads the page itself; screenshots go to test-output/e2e/.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Frame } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { focusEditorArea, goTo, openFile, runCommand, screenshot, setTheme, startWorkbench, type Workbench } from './harness';

let wb: Workbench;

beforeAll(async () => {
  wb = await startWorkbench(join(process.cwd(), 'pneumark.vsix'));
}, 600_000);

afterAll(async () => {
  await wb?.close();
});

describe('Pneumark in VS Code', () => {
  it('detects the language of a .pneu note', async () => {
    await openFile(wb.page, 'icu-ventilated-lung-injury.pneu');
    const mode = wb.page.locator('#status\\.editor\\.mode');
    await expect.poll(async () => (await mode.textContent())?.trim(), { timeout: 30000 }).toBe('Pneumark');
    await screenshot(wb.page, '01-note-open');
  });

  it('shows inlay hints with derived values', async () => {
    const lines = wb.page.locator('.editor-instance .monaco-editor .view-lines').first();
    await expect.poll(async () => (await lines.textContent()) ?? '', { timeout: 60000 }).toMatch(/P\/F\s93/);
    expect(await lines.textContent()).toMatch(/ΔP\s19/);
    await screenshot(wb.page, '02-inlay-hints');
  });

  it('shows the key figures of the timepoint under the cursor in the status bar', async () => {
    await goTo(wb.page, 9, 1);
    const item = wb.page.locator('.statusbar-item', { hasText: 'P/F 93' });
    await item.first().waitFor({ timeout: 30000 });
    expect(await item.first().textContent()).toMatch(/pH 7\.29/);
    // A screen reader reads the figures as the item's name.
    const named = wb.page.locator('#workbench\\.parts\\.statusbar [aria-label^="Pneumark timepoint"]').first();
    await named.waitFor({ timeout: 15000 });
    expect(await named.getAttribute('aria-label')).toMatch(/^Pneumark timepoint admitted to intensive care, intubated: P\/F 93 mmHg, .*pH 7\.29/);
  });

  it('lists findings in the Problems panel with our codes', async () => {
    await wb.page.keyboard.press('Control+Shift+M');
    const rows = wb.page.locator('.markers-panel .monaco-list-row');
    await expect.poll(async () => (await rows.allTextContents()).join('\n'), { timeout: 30000 }).toMatch(/PN405/);
    expect((await rows.allTextContents()).join('\n')).toMatch(/Driving pressure is 19 cmH2O/);
    await screenshot(wb.page, '03-problems');
  });

  it('shows a hover with the formula and where the inputs came from', async () => {
    await wb.page.locator('.editor-instance .monaco-editor .view-line span', { hasText: 'plateau' }).first().hover();
    const hover = wb.page.locator('.monaco-hover:not(.hidden)').first();
    await hover.waitFor({ timeout: 20000 });
    await expect.poll(async () => (await hover.textContent()) ?? '', { timeout: 20000 }).toMatch(/Plateau pressure/);
    expect(await hover.textContent()).toMatch(/licensed practice/);
    await screenshot(wb.page, '04-hover');
    await wb.page.keyboard.press('Escape');
  });

  it('applies a quick fix', async () => {
    await openFile(wb.page, 'broken-note.pneu');
    await goTo(wb.page, 8, 15);
    await wb.page.keyboard.press('Control+.');
    const item = wb.page.locator('.action-widget .monaco-list-row', { hasText: 'Write `7.35`' }).first();
    await item.waitFor({ timeout: 20000 });
    await screenshot(wb.page, '05-quick-fix');
    await wb.page.keyboard.press('Enter');
    const lines = wb.page.locator('.editor-instance .monaco-editor .view-lines').first();
    await expect.poll(async () => (await lines.textContent()) ?? '', { timeout: 20000 }).toMatch(/ph\s7\.35,\spco2\s41/);
  });

  it('restarts the language server on command and keeps serving', async () => {
    await runCommand(wb.page, 'Pneumark: Restart Language Server');
    // The broken note is the active editor: a line typed after the restart is checked by the new server.
    await goTo(wb.page, 3, 1);
    await wb.page.keyboard.type('vitlz hr 80\n');
    const rows = wb.page.locator('.markers-panel .monaco-list-row');
    await wb.page.keyboard.press('Control+Shift+M');
    await expect.poll(async () => (await rows.allTextContents()).join('\n'), { timeout: 60000 }).toMatch(/`vitlz` is not a section/);
    await screenshot(wb.page, '07-after-restart');
    await focusEditorArea(wb.page);
    await wb.page.keyboard.press('Control+Z');
  });

  it('opens the trend view and draws the charts', async () => {
    await openFile(wb.page, 'icu-ventilated-lung-injury.pneu');
    await runCommand(wb.page, 'Pneumark: Show Trends');
    await expect.poll(async () => {
      let canvases = 0;
      for (const frame of wb.page.frames()) canvases += await frame.locator('canvas').count().catch(() => 0);
      return canvases;
    }, { timeout: 60000 }).toBeGreaterThanOrEqual(4);
    const texts = async (selector: string) => {
      const out: string[] = [];
      for (const frame of wb.page.frames()) out.push(...(await frame.locator(selector).allTextContents().catch(() => [])));
      return out;
    };
    expect(await texts('.panel h2')).toEqual(expect.arrayContaining(['Oxygenation', 'Carbon dioxide and pH', 'Saturation and FiO2', 'Ventilator']));
    expect((await texts('#title')).join()).toMatch(/icu-ventilated-lung-injury\.pneu/);
    const legend = (await texts('.legend .label')).join(' ');
    for (const series of ['PaO2', 'P/F', 'PaCO2', 'pH', 'SpO2', 'FiO2', 'PEEP', 'ΔP', 'Cstat']) expect(legend).toContain(series);
    // The panels name the units of their axes (drawn on the canvas): this note's gases are in mmHg.
    expect(await panelNames()).toEqual(expect.arrayContaining(['Oxygenation (mmHg)', 'Carbon dioxide and pH (mmHg, pH)', 'Saturation and FiO2 (%)']));
    await screenshot(wb.page, '06-trends-dark');
  });

  it('keeps the trend view readable in light and high-contrast themes', async () => {
    for (const [theme, name] of [['Light Modern', '08-trends-light'], ['Dark High Contrast', '09-trends-high-contrast']] as const) {
      await setTheme(wb.page, theme);
      await expect.poll(async () => {
        let canvases = 0;
        for (const frame of wb.page.frames()) canvases += await frame.locator('canvas').count().catch(() => 0);
        return canvases;
      }, { timeout: 30000 }).toBeGreaterThanOrEqual(4);
      await screenshot(wb.page, name);
    }
  });

  it('plots the gases of a kPa note in kPa, on the axes and in the legend', async () => {
    await openFile(wb.page, 'home-oxygen-exacerbation.pneu');
    await runCommand(wb.page, 'Pneumark: Show Trends');
    await expect.poll(panelNames, { timeout: 60000 }).toContain('Oxygenation (kPa)');
    expect(await panelNames()).toContain('Carbon dioxide and pH (kPa, pH)');
    // Under the cursor the legend gives each value with its unit: PaO2 and P/F in kPa.
    const frame = await frameWith('section.panel[aria-label="Oxygenation (kPa)"]');
    const oxygenation = frame.locator('section.panel[aria-label="Oxygenation (kPa)"]');
    await oxygenation.locator('.u-over').hover();
    await expect.poll(async () => (await oxygenation.locator('.legend .value').allTextContents()).join(' '), { timeout: 20000 }).toMatch(/\d+(\.\d)? kPa \d+(\.\d)? kPa$/);
    await screenshot(wb.page, '10-trends-kpa');
  });

  it('follows the note the user switches to, and goes to a timepoint from the keyboard', async () => {
    await openFile(wb.page, 'icu-ventilated-lung-injury.pneu');
    await expect.poll(async () => (await texts('#title')).join(), { timeout: 30000 }).toMatch(/icu-ventilated-lung-injury\.pneu/);
    // The table under the charts: a button per timepoint, reached with Tab and pressed with Enter.
    const frame = await frameWith('button.go');
    const buttons = frame.locator('button.go');
    await expect.poll(() => buttons.count(), { timeout: 30000 }).toBe(4);
    await buttons.nth(1).focus();
    await wb.page.keyboard.press('Tab');
    expect(await frame.evaluate('document.activeElement?.textContent')).toBe('morning round');
    await wb.page.keyboard.press('Enter');
    const selection = wb.page.locator('#status\\.editor\\.selection');
    await expect.poll(async () => (await selection.textContent())?.trim(), { timeout: 20000 }).toMatch(/^Ln 16, Col 1/);
    await screenshot(wb.page, '11-trends-table');
  });

  it('comes back with its note after the window is reloaded', async () => {
    // Reloaded as a user reloads it (Developer: Reload Window), which saves the workbench's state
    // first: a reload of the browser page alone may come back with state saved earlier (another note).
    const loaded = wb.page.waitForEvent('load', { timeout: 60000 });
    await runCommand(wb.page, 'Developer: Reload Window');
    await loaded;
    await wb.page.locator('.monaco-workbench').waitFor({ timeout: 60000 });
    await expect.poll(async () => (await texts('#title')).join(), { timeout: 90000 }).toMatch(/icu-ventilated-lung-injury\.pneu/);
    await expect.poll(canvases, { timeout: 60000 }).toBeGreaterThanOrEqual(4);
    await screenshot(wb.page, '12-trends-after-reload');
  });

  it('comes back alone with its note\'s trends after a reload with the note closed', async () => {
    // Only the trend view is left open: no Pneumark note comes back with the window, so nothing
    // but the trend view itself can wake the extension up after the reload.
    await expect.poll(async () => (await texts('#title')).join(), { timeout: 30000 }).toMatch(/icu-ventilated-lung-injury\.pneu/);
    await closeAllButTrends('icu-ventilated-lung-injury.pneu');
    await expect.poll(async () => (await texts('#title')).join(), { timeout: 30000 }).toMatch(/icu-ventilated-lung-injury\.pneu/);
    const loaded = wb.page.waitForEvent('load', { timeout: 60000 });
    await runCommand(wb.page, 'Developer: Reload Window');
    await loaded;
    await wb.page.locator('.monaco-workbench').waitFor({ timeout: 60000 });
    await wb.page.locator('.tab[aria-label^="Trends"]').first().waitFor({ timeout: 60000 });
    try {
      await expect.poll(async () => (await texts('#title')).join(), { timeout: 90000 }).toMatch(/icu-ventilated-lung-injury\.pneu/);
      await expect.poll(canvases, { timeout: 60000 }).toBeGreaterThanOrEqual(4);
      // The note's own data (read from disk for the view), not a notice: one row per timepoint.
      await expect.poll(async () => (await texts('button.go')).length, { timeout: 30000 }).toBe(4);
    } catch (error) {
      await screenshot(wb.page, 'failed-15-trends-alone-after-reload');
      throw error;
    }
    // The view reads its note without opening an editor for it.
    expect(await editorTabs()).toEqual([]);
    await screenshot(wb.page, '15-trends-alone-after-reload');
  });

  it('opens the bundled check documentation at the check picked', async () => {
    await openFile(wb.page, 'icu-ventilated-lung-injury.pneu');
    /** Picks PN405 from the command's list, and waits until the preview shows its heading in view. */
    const pickAndSee = async (timeout: number) => {
      await runCommand(wb.page, 'Pneumark: Open Check Documentation…');
      const input = wb.page.locator('.quick-input-widget input');
      await input.fill('PN405');
      await wb.page.locator('.quick-input-list .monaco-list-row', { hasText: 'PN405' }).first().waitFor({ timeout: 15000 });
      // Enter picks the focused row: wait until the filter has made it PN405's (the unfiltered list
      // holds a PN405 row too, and Enter there would open the first check).
      await expect.poll(async () => (await wb.page.locator('.quick-input-list .monaco-list-row.focused').first().textContent().catch(() => null)) ?? '', { timeout: 15000 }).toContain('PN405');
      await wb.page.keyboard.press('Enter');
      // The preview scrolls to the check's heading (not the top of the list of checks).
      await expect.poll(async () => {
        for (const f of wb.page.frames()) {
          const heading = f.locator('h2', { hasText: /^PN405 / }).first();
          if (await heading.count().catch(() => 0) === 0) continue;
          // Runs in the page: the heading's top is within the preview's window. The preview scrolls
          // to fractional positions, so a heading scrolled to the top may sit a fraction of a pixel
          // above it (-0.14 px was seen).
          return heading.evaluate((el) => {
            const top = (el as unknown as { getBoundingClientRect(): { top: number } }).getBoundingClientRect().top;
            return top > -1 && top < (globalThis as unknown as { innerHeight: number }).innerHeight;
          });
        }
        return false;
      }, { timeout }).toBe(true);
    };
    try {
      await pickAndSee(30000);
    } catch {
      // Once, in a fresh clone's run, the first preview of the documentation stayed some sections
      // above the check picked (a timing of VS Code's preview, not reproduced since, under load
      // either): a user picks again, and the preview must then come to the heading.
      await screenshot(wb.page, 'retry-13-check-docs');
      console.warn('check documentation: the first preview was not at PN405; picked again');
      try {
        await pickAndSee(60000);
      } catch (error) {
        await screenshot(wb.page, 'failed-13-check-docs');
        throw error;
      }
    }
    await screenshot(wb.page, '13-check-docs');
  });

  it('opens the documentation of a finding\'s check from its code in the Problems panel', async () => {
    // The code links to the check rendered, at its heading (the file link opened the Markdown
    // source at its first line). PN410, where the preview the test before left shows PN405.
    await openFile(wb.page, 'icu-ventilated-lung-injury.pneu');
    await runCommand(wb.page, 'Problems: Focus on Problems View');
    const code = wb.page.locator('.markers-panel .monaco-list-row a', { hasText: /^PN410$/ }).first();
    await code.waitFor({ timeout: 30000 });
    await code.click();
    try {
      await expect.poll(() => headingInView(/^PN410 /), { timeout: 60000 }).toBe(true);
    } catch (error) {
      await screenshot(wb.page, 'failed-16-code-link');
      throw error;
    }
    await screenshot(wb.page, '16-code-link');
  });

  it('applies a setting changed while a note is open, without a reload or an edit', async () => {
    await openFile(wb.page, 'icu-ventilated-lung-injury.pneu');
    const lines = wb.page.locator('.editor-instance .monaco-editor .view-lines').first();
    await expect.poll(async () => (await lines.textContent()) ?? '', { timeout: 60000 }).toMatch(/P\/F\s93/);
    // The oxygenation hints (P/F) switched off in the workspace's settings: they go at once.
    mkdirSync(join(wb.workspace, '.vscode'), { recursive: true });
    writeFileSync(join(wb.workspace, '.vscode', 'settings.json'), JSON.stringify({ 'pneumark.hints.oxygenation': false }));
    await expect.poll(async () => (await lines.textContent()) ?? '', { timeout: 60000 }).not.toMatch(/P\/F\s93/);
    // The other hints stay (ΔP is a mechanics hint).
    expect(await lines.textContent()).toMatch(/ΔP\s19/);
    await screenshot(wb.page, '14-setting-applied');
    writeFileSync(join(wb.workspace, '.vscode', 'settings.json'), '{}');
  });
});

/** The text of the elements a selector finds, in every frame. */
async function texts(selector: string): Promise<string[]> {
  const out: string[] = [];
  for (const frame of wb.page.frames()) out.push(...(await frame.locator(selector).allTextContents().catch(() => [])));
  return out;
}

/** Whether a frame shows a heading of the check documentation within its window. */
async function headingInView(text: RegExp): Promise<boolean> {
  for (const f of wb.page.frames()) {
    const heading = f.locator('h2', { hasText: text }).first();
    if (await heading.count().catch(() => 0) === 0) continue;
    // Runs in the page; the preview scrolls to fractional positions (a heading at the top may sit
    // a fraction of a pixel above it).
    return heading.evaluate((el) => {
      const top = (el as unknown as { getBoundingClientRect(): { top: number } }).getBoundingClientRect().top;
      return top > -1 && top < (globalThis as unknown as { innerHeight: number }).innerHeight;
    });
  }
  return false;
}

/** The charts drawn, in every frame. */
async function canvases(): Promise<number> {
  let count = 0;
  for (const frame of wb.page.frames()) count += await frame.locator('canvas').count().catch(() => 0);
  return count;
}

/** The accessible names of the trend view's panels (title and axis units), in every frame. */
async function panelNames(): Promise<string[]> {
  const out: string[] = [];
  for (const frame of wb.page.frames()) {
    for (const panel of await frame.locator('section.panel').all().catch(() => [])) out.push((await panel.getAttribute('aria-label').catch(() => null)) ?? '');
  }
  return out;
}

/** The names of the editor tabs other than the trend view's. */
async function editorTabs(): Promise<string[]> {
  const out: string[] = [];
  for (const tab of await wb.page.locator('.tabs-container .tab:not([aria-label^="Trends"])').all()) out.push((await tab.getAttribute('aria-label')) ?? '');
  return out;
}

/**
 * Closes every editor but the trend view, one at a time as a user would (unsaved changes an
 * earlier test made are thrown away: "Revert and Close Editor"), the note `last` last: the view
 * follows the note that becomes active as the others close, so it ends on that one.
 */
async function closeAllButTrends(last: string): Promise<void> {
  for (let left = await editorTabs(); left.length > 0; left = await editorTabs()) {
    const others = wb.page.locator(`.tabs-container .tab:not([aria-label^="Trends"]):not([aria-label*="${last}"])`);
    const tab = (await others.count()) > 0 ? others.first() : wb.page.locator('.tabs-container .tab:not([aria-label^="Trends"])').first();
    const label = (await tab.getAttribute('aria-label')) ?? '';
    await tab.click();
    // The command acts on the active editor: wait until it is this one, in the active group.
    await wb.page.locator(`.editor-group-container.active .tab.active[aria-label="${label.replace(/["\\]/g, '\\$&')}"]`).first().waitFor({ timeout: 15000 });
    await runCommand(wb.page, 'View: Revert and Close Editor');
    await expect.poll(async () => (await editorTabs()).length, { timeout: 15000 }).toBe(left.length - 1);
  }
  await wb.page.locator('.tabs-container .tab[aria-label^="Trends"]').first().waitFor({ timeout: 15000 });
}

/** The frame that holds an element (the trend view's page is a frame in a frame). */
async function frameWith(selector: string): Promise<Frame> {
  for (const frame of wb.page.frames()) if (await frame.locator(selector).count().catch(() => 0) > 0) return frame;
  throw new Error(`no frame holds ${selector}`);
}
