// Outputs that cannot destroy inputs: `bake` and `render` refuse an output that is an input under any name (hard
// link, symbolic link, a folder link, a /proc alias, another case where the file system folds case), compared by
// device and inode; they write a temporary file in the output's folder and rename it into place, so a failure
// leaves the old output and no temporary file behind.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, linkSync, mkdtempSync, readFileSync, readdirSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { EXIT } from '../../runtime/cli/cli-io';
import { readWav, writeWav } from '../../runtime/offline';
import { runCli } from '../runtime/cli/run-cli';

const dir = mkdtempSync(join(tmpdir(), 'ralenti-cli-outputs-'));
const path = (name: string) => join(dir, name);
let good: Buffer;
let scene: Buffer;

beforeAll(() => {
  const x = new Float32Array(4800).map((_, i) => 0.5 * Math.sin((2 * Math.PI * 440 * i) / 48000));
  good = Buffer.from(writeWav({ sampleRate: 48000, channels: [x], encoding: 'pcm16' }));
  writeFileSync(path('Good.wav'), good);
  linkSync(path('Good.wav'), path('hard-link.wav'));
  symlinkSync(path('Good.wav'), path('soft-link.wav'));
  symlinkSync(dir, path('folder-link'));
  scene = Buffer.from(JSON.stringify({ version: 1, duration: 0.2, sounds: { s: { type: 'file', path: 'Good.wav' } }, voices: [{ sound: 's' }] }));
  writeFileSync(path('scene.json'), scene);
  linkSync(path('scene.json'), path('scene-link.json'));
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Case-folding file systems (default on macOS and Windows) find Good.wav as good.wav. */
const foldsCase = () => existsSync(path('good.wav')) && statSync(path('good.wav')).ino === statSync(path('Good.wav')).ino;

const aliases: [string, () => string][] = [
  ['a hard link to the input', () => path('hard-link.wav')],
  ['a symbolic link to the input', () => path('soft-link.wav')],
  ['the input through a linked folder', () => join(path('folder-link'), 'Good.wav')],
  ['the input through /proc/self/root (a bind-like alias)', () => join('/proc/self/root', path('Good.wav'))],
  ['the input with ./ and .. in its path', () => `${dir}/./folder-link/../Good.wav`],
];

function untouched(): void {
  expect(readFileSync(path('Good.wav')).equals(good)).toBe(true);
  expect(readFileSync(path('scene.json')).equals(scene)).toBe(true);
  expect(readdirSync(dir).filter((f) => f.endsWith('.part'))).toEqual([]);
}

describe('outputs that are inputs under another name', () => {
  it.each(aliases)('bake refuses %s as its output and leaves it intact', async (_what, output) => {
    const r = await runCli(['bake', path('Good.wav'), '--speed', '0.5', '-q', '-o', output()]);
    expect(r.code).toBe(EXIT.usage);
    expect(r.err).toMatch(/refusing to overwrite the input/);
    untouched();
  });

  it.each(aliases)('render refuses %s (the scene\'s sound file) as its output', async (_what, output) => {
    const r = await runCli(['render', path('scene.json'), '-q', '-o', output()]);
    expect(r.code).toBe(EXIT.usage);
    expect(r.err).toMatch(/refusing to overwrite the input/);
    untouched();
  });

  it('render refuses a hard link to the scene script itself', async () => {
    const r = await runCli(['render', path('scene.json'), '-q', '-o', path('scene-link.json')]);
    expect(r.code).toBe(EXIT.usage);
    untouched();
  });

  it('check refuses a report path that is a hard link to the scene script', async () => {
    const tone = JSON.stringify({ version: 1, duration: 0.5, sounds: { t: { type: 'tone', frequency: 440 } }, voices: [{ sound: 't' }] });
    writeFileSync(path('tone.json'), tone);
    linkSync(path('tone.json'), path('tone-link.svg'));
    const r = await runCli(['check', path('tone.json'), '-q', '--report', path('tone-link.svg')]);
    expect(r.code).toBe(EXIT.usage);
    expect(readFileSync(path('tone.json'), 'utf8')).toBe(tone);
    untouched();
  });

  it('treats another letter case as the input exactly when the file system folds case', async () => {
    const r = await runCli(['bake', path('Good.wav'), '--speed', '0.5', '-q', '-o', path('good.wav')]);
    if (foldsCase()) expect(r.code).toBe(EXIT.usage);
    else {
      expect(r.code).toBe(EXIT.ok);
      rmSync(path('good.wav'));
    }
    untouched();
  });
});

describe('writing through a temporary file', () => {
  it('replaces an existing output only when the new one is complete, leaving no temporary file', async () => {
    writeFileSync(path('out.wav'), 'an earlier render');
    const r = await runCli(['bake', path('Good.wav'), '--speed', '2', '-q', '-o', path('out.wav')]);
    expect(r.code).toBe(EXIT.ok);
    expect(readWav(readFileSync(path('out.wav'))).channels[0].length).toBe(2400);
    untouched();
  });

  it('keeps an existing output when the write fails (output folder removed), and no temporary file remains', async () => {
    writeFileSync(path('kept.wav'), 'keep me');
    const r = await runCli(['bake', path('Good.wav'), '--speed', '0.5', '-q', '-o', path('kept.wav/inside.wav')]);
    expect(r.code).toBe(EXIT.output);
    expect(readFileSync(path('kept.wav'), 'utf8')).toBe('keep me');
    untouched();
  });

  it('replaces a symbolic link output by the new file instead of writing through it', async () => {
    writeFileSync(path('target.txt'), 'not an input, but not to be written through a link either');
    symlinkSync(path('target.txt'), path('link-out.wav'));
    const r = await runCli(['bake', path('Good.wav'), '--speed', '2', '-q', '-o', path('link-out.wav')]);
    expect(r.code).toBe(EXIT.ok);
    expect(readFileSync(path('target.txt'), 'utf8')).toMatch(/^not an input/);
    expect(readWav(readFileSync(path('link-out.wav'))).channels[0].length).toBe(2400);
    untouched();
  });
});
