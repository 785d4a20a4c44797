// The `ralenti` command line around its verbs: --version, unknown options (usage, exit 2), and -q / progress on every
// long verb (render, bake, check), each verb's help listing -q.
import { beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { writeWav } from '../../../runtime/offline';
import { commands } from '../../../runtime/cli/ralenti';
import { runCli } from './run-cli';

const root = resolve(__dirname, '../../..');
const flyby = join(root, 'runtime/offline/examples/flyby.json');
let dir = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'ralenti-cli-options-'));
  const x = new Float32Array(4800).map((_, i) => 0.25 * Math.sin((2 * Math.PI * 440 * i) / 48000));
  writeFileSync(join(dir, 'tone.wav'), writeWav({ sampleRate: 48000, channels: [x], encoding: 'pcm16' }));
});

describe('ralenti command line', () => {
  it.each([['--version'], ['-V']])('prints the package version for %s and exits 0', async (flag) => {
    const r = await runCli([flag]);
    expect(r.code).toBe(0);
    expect(r.out).toBe(`${JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).version}\n`);
  });

  it.each([['--bogus'], ['-x']])('refuses the unknown option %s with the usage and exit code 2', async (flag) => {
    const r = await runCli([flag]);
    expect(r.code).toBe(2);
    expect(r.err.split('\n')[0]).toBe(`ralenti: unknown option ${flag}`);
    expect(r.err).toContain('usage: ralenti <command>');
  });

  it.each(commands.map((c) => [c.name]))('lists -q in `ralenti %s --help`', async (name) => {
    expect((await runCli([name, '--help'])).out).toMatch(/-q, --quiet/);
  });

  const runs: Record<string, (out: string) => string[]> = {
    render: (out) => ['render', flyby, '-o', out],
    bake: (out) => ['bake', join(dir, 'tone.wav'), '--speed', '0.5', '-o', out],
    check: () => ['check', flyby],
  };

  it.each(Object.keys(runs).map((v) => [v]))('`ralenti %s` shows progress on stderr, and nothing there with -q', async (verb) => {
    const loud = await runCli(runs[verb](join(dir, `${verb}-loud.wav`)));
    // A check exits with its verdict: 0 pass, 1 fail (today's default engine fails the fly-by; docs/checker.md).
    expect(verb === 'check' ? [0, 1] : [0]).toContain(loud.code);
    expect(loud.err).toMatch(/100%/);
    const quiet = await runCli([...runs[verb](join(dir, `${verb}-quiet.wav`)), '-q']);
    expect(quiet.code).toBe(loud.code);
    expect(quiet.err).toBe('');
    expect(quiet.out).toBe(loud.out.replaceAll('-loud.wav', '-quiet.wav'));
  }, 60_000);
});
