// Extension-host tests in a desktop VS Code, for machines that have one (code-server cannot run
// an extension test suite). Uses VSCODE_EXECUTABLE when set (a local VS Code 1.100+), otherwise
// @vscode/test-electron downloads VS Code, which needs the internet. Not part of CI here; run
// with `npm run test:vscode`.
import { runTests } from '@vscode/test-electron';
import { mkdtempSync, cpSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const root = resolve('.');
const workspace = mkdtempSync(join(tmpdir(), 'pneumark-vscode-'));
cpSync(join(root, 'samples'), workspace, { recursive: true });
try {
  await runTests({
    extensionDevelopmentPath: root,
    extensionTestsPath: join(root, 'tests/vscode/suite.cjs'),
    launchArgs: [workspace, '--disable-extensions', '--disable-workspace-trust'],
    ...(process.env.VSCODE_EXECUTABLE ? { vscodeExecutablePath: process.env.VSCODE_EXECUTABLE } : { version: '1.100.3' }),
  });
} catch (error) {
  console.error(`extension-host tests failed: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
}
