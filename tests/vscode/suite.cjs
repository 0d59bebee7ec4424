// Runs inside VS Code's extension host (see run.mjs): the extension's features through the
// editor's own commands. Plain Node assertions; waits on conditions with time limits.
const assert = require('node:assert/strict');
const path = require('node:path');
const vscode = require('vscode');

async function until(what, probe, timeoutMs = 30000) {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

const tests = {
  async 'detects the language and publishes diagnostics with codes'(doc) {
    assert.equal(doc.languageId, 'pneumark');
    const diagnostics = await until('diagnostics', () => {
      const list = vscode.languages.getDiagnostics(doc.uri);
      return list.length > 0 ? list : null;
    });
    assert.ok(diagnostics.some((d) => d.code && (d.code.value ?? d.code) === 'PN405'));
  },
  async 'shows a hover with a caution'(doc) {
    const line = doc.getText().split('\n').findIndex((l) => l.startsWith('vent      mode VC'));
    const hovers = await vscode.commands.executeCommand('vscode.executeHoverProvider', doc.uri, new vscode.Position(line, 12));
    const text = hovers.flatMap((h) => h.contents.map((c) => (typeof c === 'string' ? c : c.value))).join('\n');
    assert.match(text, /licensed practice/);
  },
  async 'gives inlay hints with derived values'(doc) {
    const hints = await vscode.commands.executeCommand('vscode.executeInlayHintProvider', doc.uri, new vscode.Range(0, 0, doc.lineCount, 0));
    const labels = hints.map((h) => (typeof h.label === 'string' ? h.label : h.label.map((p) => p.value).join('')));
    assert.ok(labels.some((l) => /P\/F 93/.test(l)), labels.join(' | '));
  },
  async 'formats and offers quick fixes'(doc) {
    const edits = await vscode.commands.executeCommand('vscode.executeFormatDocumentProvider', doc.uri, { tabSize: 2, insertSpaces: true });
    assert.ok(Array.isArray(edits));
    const actions = await vscode.commands.executeCommand('vscode.executeCodeActionProvider', doc.uri, new vscode.Range(8, 0, 8, 80));
    assert.ok(Array.isArray(actions));
  },
  async 'opens the trend view'() {
    await vscode.commands.executeCommand('pneumark.showTrends');
    await until('a trend panel', () => vscode.window.tabGroups.all.some((g) => g.tabs.some((t) => /Trends/.test(t.label))));
  },
};

exports.run = async function run() {
  const folder = vscode.workspace.workspaceFolders?.[0]?.uri.fsPath;
  assert.ok(folder, 'a workspace folder is open');
  const doc = await vscode.workspace.openTextDocument(path.join(folder, 'icu-ventilated-lung-injury.pneu'));
  await vscode.window.showTextDocument(doc);
  let failed = 0;
  for (const [name, test] of Object.entries(tests)) {
    try {
      await test(doc);
      console.log(`  ✓ ${name}`);
    } catch (error) {
      failed++;
      console.log(`  ✗ ${name}: ${error instanceof Error ? error.message : String(error)}`);
    }
  }
  console.log(`${Object.keys(tests).length - failed} passed, ${failed} failed`);
  if (failed > 0) throw new Error(`${failed} extension-host test(s) failed`);
};
