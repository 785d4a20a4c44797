// docs/cli.md's `npx ralenti …` lines, run through the tool's main() (via runCli): each command works as shown, and the printed
// check output matches the text block shown there. Outputs go to a temporary folder, never over repository files.
import { describe, expect, it, beforeAll } from 'vitest';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { basename, join, resolve } from 'node:path';
import { tmpdir } from 'node:os';
import { commands } from '../../../runtime/cli/ralenti';
import { runCli } from './run-cli';

const root = resolve(__dirname, '../../..');
const readme = readFileSync(join(root, 'docs', 'cli.md'), 'utf8');

/** Every `npx ralenti …` line of the README's sh blocks, without its trailing comment, split into words. */
function readmeCommands(): string[][] {
  const lines: string[][] = [];
  for (const block of readme.split('```sh\n').slice(1).map((b) => b.split('```')[0])) {
    for (const line of block.split('\n')) {
      const words = line.replace(/#.*$/, '').trim().split(/\s+/);
      if (words[0] === 'npx' && words[1] === 'ralenti') lines.push(words.slice(2));
    }
  }
  return lines;
}

const OUTPUT_FLAGS = new Set(['-o', '--output', '--report']);

/** Repository inputs keep their path; outputs and files the README only names go to `dir`. */
function localise(words: string[], dir: string): string[] {
  return words.map((w, i) => {
    if (w.startsWith('-') || i === 0) return w;
    if (OUTPUT_FLAGS.has(words[i - 1])) return join(dir, basename(w));
    if (/\.(json|wav)$/.test(w)) return existsSync(join(root, w)) ? join(root, w) : join(dir, basename(w));
    return w;
  });
}

const run = (argv: string[]) => runCli(argv);

let dir = '';
beforeAll(() => {
  // Lines run in order in one folder: `bake` reads the file the `render` line before it wrote.
  dir = mkdtempSync(join(tmpdir(), 'ralenti-readme-'));
});

describe('docs/cli.md command lines', () => {
  const lines = readmeCommands();

  it('shows render, bake and check, and per-command help', () => {
    const shown = new Set(lines.map((l) => l[0]));
    for (const c of commands) expect(shown.has(c.name), c.name).toBe(true);
    expect(lines.some((l) => l[0] === '<command>' && l[1] === '--help')).toBe(true);
  });

  it.each(readmeCommands().filter((l) => l[0] !== '<command>').map((l) => [l.join(' '), l]))('runs `ralenti %s` with exit code 0 (a check: 0 or 1, its verdict)', async (_text, words) => {
    const argv = localise(words as string[], dir);
    const r = await run([...argv, ...(['check', 'render', 'bake'].includes(argv[0]) ? ['-q'] : [])]);
    expect(r.err).toBe('');
    expect(argv[0] === 'check' ? [0, 1] : [0]).toContain(r.code);
    for (let i = 1; i < argv.length; i++) if (OUTPUT_FLAGS.has(argv[i - 1])) expect(existsSync(argv[i]), argv[i]).toBe(true);
  });

  it.each(commands.map((c) => [c.name]))('answers `ralenti %s --help` as the generic help line promises', async (name) => {
    const r = await run([name, '--help']);
    expect(r.code).toBe(0);
    expect(r.out.startsWith(`usage: ralenti ${name} `)).toBe(true);
  });

  it('prints the check output shown in docs/cli.md for the fly-by, with the exit code its verdict implies', async () => {
    const section = readme.slice(readme.indexOf('## Checking Doppler behaviour'));
    const shown = /```text\n([\s\S]*?)```/.exec(section)?.[1];
    expect(shown).toBeDefined();
    const line = lines.find((l) => l[0] === 'check' && l.includes('docs/check-report.svg'));
    expect(line).toBeDefined();
    const argv = localise(line!, dir);
    const report = argv[argv.indexOf('--report') + 1];
    const r = await run([...argv, '-q']);
    expect(r.code).toBe(/^FAIL/m.test(shown!) ? 1 : 0);
    const shownReport = line![line!.indexOf('--report') + 1];
    expect(r.out).toBe(shown!.replace(`report written to ${shownReport}`, `report written to ${report}`));
  });
});
