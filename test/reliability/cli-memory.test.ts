// The bundled `ralenti` streams: a 30-minute WAV file baked and a 10-minute scene rendered stay within 200 MB of
// memory (maximum resident set size of the child process), and their outputs have the expected length.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeSync, existsSync, mkdtempSync, openSync, readdirSync, rmSync, statSync, writeFileSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawn, spawnSync } from 'node:child_process';
import { wavHeader } from '../../runtime/offline';

const dir = mkdtempSync(join(tmpdir(), 'ralenti-cli-memory-'));
const RATE = 8000;
const MINUTES = 30;
const FRAMES = MINUTES * 60 * RATE;
let bundle = '';
const probe = join(dir, 'report-memory.mjs');

beforeAll(async () => {
  const { buildCli } = await import('../../scripts/build-cli.mjs');
  bundle = await buildCli({ outfile: join(dir, 'ralenti.mjs') });
  // Loaded before the program: prints the child's peak resident set size (kB on Linux) when it exits.
  writeFileSync(probe, "process.on('exit', () => process.stderr.write(`\\nmaxrss-kb ${process.resourceUsage().maxRSS}\\n`));\n");
  // A 30-minute mono 16-bit file of a 440 Hz tone, written in slices (the test itself keeps memory small too).
  const fd = openSync(join(dir, 'long.wav'), 'w');
  writeSync(fd, wavHeader(RATE, 1, 'pcm16', FRAMES));
  const slice = Buffer.alloc(2 * RATE * 60);
  for (let m = 0; m < MINUTES; m++) {
    for (let i = 0; i < RATE * 60; i++) slice.writeInt16LE(Math.round(8000 * Math.sin((2 * Math.PI * 440 * (m * RATE * 60 + i)) / RATE)), 2 * i);
    writeSync(fd, slice);
  }
  closeSync(fd);
  writeFileSync(
    join(dir, 'long-scene.json'),
    JSON.stringify({ version: 1, duration: 600, sampleRate: RATE, sounds: { t: { type: 'tone', frequency: 220, seconds: 1 } }, voices: [{ sound: 't', loop: true }] }),
  );
}, 120_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

function runMeasured(args: string[]): { status: number | null; maxRssMb: number; stderr: string } {
  const r = spawnSync(process.execPath, ['--import', probe, bundle, ...args], { encoding: 'utf8' });
  const kb = Number(/maxrss-kb (\d+)/.exec(r.stderr)?.[1] ?? NaN);
  return { status: r.status, maxRssMb: kb / 1024, stderr: r.stderr };
}

describe('ralenti streams with bounded memory', () => {
  it('bakes a 30-minute file at speed 0.5 within 200 MB', () => {
    const out = join(dir, 'long-slow.wav');
    const r = runMeasured(['bake', join(dir, 'long.wav'), '--speed', '0.5', '-o', out, '-q']);
    console.log(`[memory] bake of a ${MINUTES}-minute ${RATE} Hz file at 0.5: max RSS ${r.maxRssMb.toFixed(1)} MB`);
    expect(r.status, r.stderr).toBe(0);
    expect(statSync(out).size).toBe(44 + 2 * 2 * FRAMES);
    expect(r.maxRssMb).toBeLessThan(200);
  }, 120_000);

  it('renders a 10-minute scene within 200 MB', () => {
    const out = join(dir, 'long-scene.wav');
    const r = runMeasured(['render', join(dir, 'long-scene.json'), '-o', out, '--encoding', 'pcm16', '-q']);
    console.log(`[memory] render of a 10-minute scene at ${RATE} Hz: max RSS ${r.maxRssMb.toFixed(1)} MB`);
    expect(r.status, r.stderr).toBe(0);
    expect(statSync(out).size).toBe(44 + 2 * 2 * 600 * RATE);
    expect(r.maxRssMb).toBeLessThan(200);
  }, 120_000);

  it('leaves neither the output nor a temporary file when interrupted with Ctrl+C (SIGINT) half-way', async () => {
    const out = join(dir, 'interrupted.wav');
    const child = spawn(process.execPath, [bundle, 'bake', join(dir, 'long.wav'), '--speed', '0.25', '-o', out], { stdio: ['ignore', 'ignore', 'pipe'] });
    let err = '';
    const code = await new Promise<number | null>((done) => {
      child.stderr!.on('data', (d) => {
        err += d.toString();
        if (/baking\s+25%/.test(err) && child.exitCode === null) child.kill('SIGINT');
      });
      child.on('exit', (c) => done(c));
    });
    expect(code, err).toBe(130);
    expect(existsSync(out)).toBe(false);
    expect(readdirSync(dir).filter((f) => f.endsWith('.part'))).toEqual([]);
  }, 120_000);
});
