import { describe, expect, it, beforeAll } from 'vitest';
import { mkdtempSync, writeFileSync, readFileSync, existsSync, copyFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { tmpdir } from 'node:os';
import { spawnSync } from 'node:child_process';
import { readWav, writeWav } from '../../../runtime/offline';
import { peakFrequency } from '../../../src/analysis';
import { runCli } from './run-cli';
import { defaultTuning, serializeTuning } from '../../../src/tuning';
import { ENGINE_HAS_PROPAGATION } from '../check/engine-switch';

const examples = resolve(__dirname, '../../../runtime/offline/examples');

const cli = (...argv: string[]) => runCli(argv);

let dir = '';
let tone = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'ralenti-cli-'));
  tone = join(dir, 'tone.wav');
  const x = new Float32Array(24000).map((_, i) => 0.5 * Math.sin((2 * Math.PI * 1000 * i) / 48000));
  writeFileSync(tone, writeWav({ sampleRate: 48000, channels: [x, x], encoding: 'pcm24' }));
});

describe('ralenti bake', () => {
  // Replay at speed V multiplies frequencies by V and divides the duration by V (scaling theorem,
  // J. O. Smith, Spectral Audio Signal Processing; docs/references.md §9, VERIFIED).
  it('bakes a 1 kHz WAV at speed 0.25 to 250 Hz and 4× the length', async () => {
    const out = join(dir, 'slow.wav');
    const r = await cli('bake', tone, '--speed', '0.25', '-o', out);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/0\.500 s → 2\.000 s/);
    const wav = readWav(readFileSync(out));
    expect(wav.encoding).toBe('pcm24');
    expect(wav.channels.length).toBe(2);
    expect(wav.channels[0].length).toBe(4 * 24000);
    const peak = peakFrequency(wav.channels[0].subarray(8000, 8000 + 65536), 48000, { windowShape: 'kaiser' });
    expect(Math.abs(peak!.frequency - 250)).toBeLessThan(0.5);
  });

  it('never overwrites its input', async () => {
    const before = readFileSync(tone);
    const r = await cli('bake', tone, '--speed', '2', '-o', tone);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/refusing to overwrite the input/);
    expect(readFileSync(tone)).toEqual(before);
  });
});

describe('ralenti render', () => {
  it('renders a scene to a WAV with a progress bar on stderr and a summary of voices, peak and clamps', async () => {
    const out = join(dir, 'flyby.wav');
    const r = await cli('render', join(examples, 'flyby.json'), '-o', out, '--rate', '16000', '--tier', 'draft', '--encoding', 'pcm16');
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/rendering 100%/);
    expect(r.out).toMatch(/voices: 1 started, 0 refused/);
    expect(r.out).toMatch(/peak: -\d+\.\d dBFS/);
    expect(r.out).toMatch(/clamps: 0/);
    const wav = readWav(readFileSync(out));
    expect(wav.sampleRate).toBe(16000);
    expect(wav.channels[0].length).toBe(10 * 16000);
  });

  it('refuses to write over the scene script or a WAV file it reads', async () => {
    const scene = join(dir, 'uses-tone.json');
    writeFileSync(scene, JSON.stringify({ duration: 0.1, sounds: { t: { type: 'file', path: 'tone.wav' } }, voices: [{ sound: 't' }] }));
    expect((await cli('render', scene, '-o', scene)).code).toBe(2);
    const r = await cli('render', scene, '-o', tone);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/refusing to overwrite the input/);
  });
});

describe('ralenti check', () => {
  it(`judges the fly-by example (${ENGINE_HAS_PROPAGATION ? 'passes' : 'fails the default Doppler smoothing'}) and writes an SVG report`, async () => {
    const report = join(dir, 'flyby.svg');
    const r = await cli('check', join(examples, 'flyby.json'), '--report', report, '--rate', '24000', '-q');
    expect(r.code).toBe(ENGINE_HAS_PROPAGATION ? 0 : 1);
    expect(r.out).toMatch(ENGINE_HAS_PROPAGATION ? /PASS {2}voice 0 \(hum on hovercar\)/ : /FAIL {2}voice 0 \(hum on hovercar\)/);
    expect(readFileSync(report, 'utf8')).toMatch(/^<svg/);
  });

  it('fails (exit 1) when the render departs from the expectation: the same-instant model smoothed over 50 ms lags a fast circle', async () => {
    // The check's expectation follows the tuning's declared model with no smoothing; a tuning that asks for the
    // same-instant model keeps its Doppler smoothing (0.05 s by default), so the swing of a 1 Hz circle arrives late.
    const tuning = JSON.parse(serializeTuning(defaultTuning));
    tuning.groups.effects = { ...tuning.groups.effects, motion: 'instant' };
    const scene = join(dir, 'circle.json');
    writeFileSync(
      scene,
      JSON.stringify({
        duration: 3,
        sampleRate: 24000,
        tuning,
        sounds: { hum: { type: 'hum', frequency: 300, seconds: 1 } },
        sources: { fly: { motion: { type: 'circle', center: [0, 0, -10], radius: 5, periodSeconds: 1 } } },
        voices: [{ sound: 'hum', source: 'fly', loop: true, gain: 4 }],
      }),
    );
    const r = await cli('check', scene, '-q');
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/FAIL {2}voice 0 \(hum on fly\) \[instant Doppler\]/);
    expect(r.out).toMatch(/1 of 1 voice\(s\) fail/);
    expect(r.out).toMatch(/voice 0 \(hum on fly\): .*\d+\.\d\d s/);
  });

  it('passes the same fast circle with the default tuning (propagation, positions only)', async () => {
    const scene = join(dir, 'circle-default.json');
    writeFileSync(
      scene,
      JSON.stringify({
        duration: 3,
        sampleRate: 24000,
        velocities: 'estimated',
        sounds: { hum: { type: 'hum', frequency: 300, seconds: 1 } },
        sources: { fly: { motion: { type: 'circle', center: [0, 0, -10], radius: 5, periodSeconds: 1 } } },
        voices: [{ sound: 'hum', source: 'fly', loop: true, gain: 4 }],
      }),
    );
    const r = await cli('check', scene, '-q');
    expect(r.out).toMatch(/PASS {2}voice 0 \(hum on fly\) \[propagation Doppler\]/);
    expect(r.code).toBe(0);
  });
});

describe('ralenti arguments and errors', () => {
  const bad = () => join(dir, 'bad.wav');
  it.each([
    ['no arguments', [], 2, /usage: ralenti <command>/],
    ['an unknown command', ['mix'], 2, /unknown command "mix"/],
    ['an unknown option', ['bake', 'x.wav', '--speed', '1', '-o', 'y.wav', '--fast'], 2, /unknown option --fast/],
    ['bake without --speed', ['bake', 'x.wav', '-o', 'y.wav'], 2, /missing --speed/],
    ['bake without -o', ['bake', 'x.wav', '--speed', '0.5'], 2, /missing -o/],
    ['a speed out of range', ['bake', 'x.wav', '--speed', '9', '-o', 'y.wav'], 2, /--speed must be a number in/],
    ['a speed that is not a number', ['bake', 'x.wav', '--speed', 'slow', '-o', 'y.wav'], 2, /--speed must be a number/],
    ['an unknown tier', ['bake', 'x.wav', '--speed', '0.5', '--tier', 'ultra', '-o', 'y.wav'], 2, /--tier must be one of draft, standard, high/],
    ['a missing input file', ['bake', 'no-such-folder/in.wav', '--speed', '0.5', '-o', 'no-such-folder/never.wav'], 3, /no such file/],
    ['a missing scene script', ['render', 'no-such-folder/scene.json', '-o', 'no-such-folder/never.wav'], 3, /cannot read/],
    ['a check report of another type', ['check', 'scene.json', '--report', 'plot.gif'], 2, /\.svg, \.html or \.png/],
  ])('rejects %s with exit code %s and a clear message', async (_name, argv, code, pattern) => {
    const r = await cli(...(argv as string[]));
    expect(r.code).toBe(code);
    expect(r.err + r.out).toMatch(pattern);
  });

  it('rejects a malformed WAV file (exit 3) and an unwritable output (exit 4)', async () => {
    writeFileSync(bad(), 'RIFF....WAVEjunk');
    const r = await cli('bake', bad(), '--speed', '0.5', '-o', join(dir, 'o.wav'));
    expect(r.code).toBe(3);
    expect(r.err).toMatch(/bad\.wav: malformed WAV file/);
    const w = await cli('bake', tone, '--speed', '0.5', '-o', join(dir, 'no-such-dir', 'o.wav'));
    expect(w.code).toBe(4);
    expect(w.err).toMatch(/cannot write .*ENOENT/);
  });

  it('reports a malformed scene script with its JSON path (exit 3)', async () => {
    const scene = join(dir, 'broken.json');
    writeFileSync(scene, JSON.stringify({ duration: 1, voices: [{ sound: 'horn' }] }));
    const r = await cli('render', scene, '-o', join(dir, 'o.wav'));
    expect(r.code).toBe(3);
    expect(r.err).toMatch(/voices\[0\]\.sound: no sound named "horn"/);
    const noise = join(dir, 'noise.json');
    writeFileSync(noise, JSON.stringify({ duration: 1, sounds: { n: { type: 'noise' } }, voices: [{ sound: 'n' }] }));
    const c = await cli('check', noise);
    expect(c.code).toBe(3);
    expect(c.err).toMatch(/no voice plays a tone or hum/);
  });

  it.each(['render', 'bake', 'check'])('prints the usage of %s for --help and exits 0', async (name) => {
    const r = await cli(name, '--help');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(new RegExp(`^usage: ralenti ${name} `));
  });
});

describe('the bundled ralenti program', () => {
  it('runs from its esbuild bundle with exit codes', async () => {
    const { buildCli } = await import('../../../scripts/build-cli.mjs');
    const bundle: string = await buildCli({ outfile: join(dir, 'ralenti.mjs') });
    expect(readFileSync(bundle, 'utf8').startsWith('#!/usr/bin/env node')).toBe(true);
    const help = spawnSync(process.execPath, [bundle, '--help'], { encoding: 'utf8' });
    expect(help.status).toBe(0);
    expect(help.stdout).toMatch(/render .*\n.*bake .*\n.*check /);
    copyFileSync(tone, join(dir, 'copy.wav'));
    const bake = spawnSync(process.execPath, [bundle, 'bake', join(dir, 'copy.wav'), '--speed', '1.5', '-o', join(dir, 'fast.wav')], { encoding: 'utf8' });
    expect(bake.status).toBe(0);
    expect(existsSync(join(dir, 'fast.wav'))).toBe(true);
    const wrong = spawnSync(process.execPath, [bundle, 'bake'], { encoding: 'utf8' });
    expect(wrong.status).toBe(2);
    expect(wrong.stderr).toMatch(/missing the input WAV file/);
  });
});
