// What a new user meets first on the command line: asking for the version and for a command's help
// the ways other command-line tools answer, and the messages of fmt, worded and escaped as those of
// the other commands are.
import { mkdirSync, mkdtempSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HELP } from '../../server/src/cli/args';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

async function cli(args: readonly string[], cwd = process.cwd()): Promise<{ code: number; out: string; err: string }> {
  const io = memoryIo({ cwd });
  const code = await run(args, io);
  return { code, out: io.out(), err: io.err() };
}

const tempDir = () => mkdtempSync(join(tmpdir(), 'pneumark-first-use-'));

describe('pneumark --version', () => {
  it('prints the version of package.json on standard output, exit 0', async () => {
    const { version } = JSON.parse(readFileSync(join(process.cwd(), 'package.json'), 'utf8')) as { version: string };
    const r = await cli(['--version']);
    expect(r).toEqual({ code: 0, out: `pneumark ${version}\n`, err: '' });
  });

  it('takes nothing after it, and is named in the main help', async () => {
    const r = await cli(['--version', 'check']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toBe('pneumark --version: takes no arguments (got "check")\n');
    expect(HELP.main).toMatch(/^ {2}pneumark --version {2,}the version$/m);
  });
});

describe('pneumark help COMMAND', () => {
  it('prints the help of that command, as COMMAND --help does', async () => {
    for (const command of ['show', 'check', 'export', 'fmt', 'docs']) {
      const r = await cli(['help', command]);
      expect(r, command).toEqual({ code: 0, out: `${HELP[command]}\n`, err: '' });
      expect((await cli([command, '--help'])).out, command).toBe(r.out);
    }
    expect((await cli(['help'])).out).toBe(`${HELP.main}\n`);
  });

  it('help has --help too, as every command has (README): help --help, help -h and help help print the main help, which describes help', async () => {
    for (const args of [['help', '--help'], ['help', '-h'], ['help', 'help']]) {
      expect(await cli(args), args.join(' ')).toEqual({ code: 0, out: `${HELP.main}\n`, err: '' });
    }
    expect(HELP.main).toMatch(/^ {2}pneumark help \[COMMAND\] {2,}/m);
  });

  it("a command's usage line says [options], or names every option its help lists", () => {
    for (const command of ['show', 'check', 'export', 'fmt', 'docs']) {
      const help = HELP[command]!;
      const usage = help.split('\n')[0]!;
      if (usage.includes('[options]')) continue;
      const options = [...new Set([...help.slice(help.indexOf('Options:')).matchAll(/^ {2}(--[a-z-]+)/gm)].map((m) => m[1]!))];
      expect(options.length, command).toBeGreaterThan(0);
      expect(options.filter((o) => !usage.includes(o)), usage).toEqual([]);
    }
  });

  it('an unknown command is a usage error that names the commands', async () => {
    const r = await cli(['help', 'chekc']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toBe('pneumark help: unknown command `chekc`; the commands are show, check, export, fmt and docs\n');
    expect((await cli(['help', 'check', 'fmt'])).err).toBe('pneumark help: takes one command (got "check", "fmt")\n');
  });
});

describe('fmt messages', () => {
  it('counts syntax errors in words (1 syntax error, 2 syntax errors)', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'one.pneu'), '@  day 1 08:00\nvitalz   hr 80\n');
    writeFileSync(join(dir, 'two.pneu'), '@  day 1 08:00\nvitalz   hr 80\nvitalz   hr 80\n');
    const r = await cli(['fmt', '--write', 'one.pneu', 'two.pneu'], dir);
    expect(r.code).toBe(2);
    expect(r.err).toBe(
      'pneumark: one.pneu: not rewritten: 1 syntax error, first at line 2; fix them or use --force\n'
      + 'pneumark: two.pneu: not rewritten: 2 syntax errors, first at line 2; fix them or use --force\n',
    );
  });

  it('write control characters of a problem visibly, as check and export do (a link to a name with an escape sequence)', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'ward'));
    symlinkSync('x\u001b[2Jy.pneu', join(dir, 'ward', 'bad.pneu'));
    for (const args of [['fmt', '--check', 'ward'], ['fmt', '--check', 'ward/bad.pneu'], ['fmt', 'ward/bad.pneu']]) {
      const r = await cli(args, dir);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.err, args.join(' ')).toBe('pneumark: ward/bad.pneu: a symbolic link to something that does not exist (x\\x1b[2Jy.pneu)\n');
    }
    const checked = await cli(['check', 'ward'], dir);
    expect(checked.err).toBe('pneumark: ward/bad.pneu: a symbolic link to something that does not exist (x\\x1b[2Jy.pneu)\n');
  });
});
