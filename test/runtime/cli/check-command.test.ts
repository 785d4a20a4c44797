import { beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { tmpdir } from 'node:os';
import { renderScene, writeWav } from '../../../runtime/offline';
import { defaultTuning, serializeTuning } from '../../../src/tuning';
import { ENGINE_HAS_PROPAGATION, engineTuning } from '../check/engine-switch';
import { runCli } from './run-cli';

const examples = resolve(__dirname, '../../../runtime/offline/examples');
/** The scene scripts shipped with the renderer (tuning files beside them are not scenes). */
const shipped = readdirSync(examples).filter((f) => f.endsWith('.json') && !f.endsWith('.tuning.json')).sort();

const cli = (...argv: string[]) => runCli(argv);

let dir = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'ralenti-check-'));
  const x = new Float32Array(8000).map((_, i) => 0.5 * Math.sin((2 * Math.PI * 500 * i) / 16000));
  writeFileSync(join(dir, 'tone.wav'), writeWav({ sampleRate: 16000, channels: [x], encoding: 'pcm16' }));
});

describe('ralenti check on the shipped examples', () => {
  it('ships the fly-by, the slow-motion scene and a fly-through recorded in the page', () => {
    expect(shipped).toEqual(['flyby.json', 'recorded-flythrough.json', 'slow-motion.json']);
  });

  it(`judges the fly-by on a re-render and ${ENGINE_HAS_PROPAGATION ? 'passes it' : 'fails the default Doppler smoothing, naming the voice and the time'}`, async () => {
    const r = await cli('check', join(examples, 'flyby.json'), '-q');
    expect(r.err).toBe('');
    expect(r.out).toMatch(/^judged an offline re-render of the script$/m);
    if (ENGINE_HAS_PROPAGATION) {
      expect(r.out).toMatch(/^PASS {2}voice 0 \(hum on hovercar\) \[propagation Doppler\]/m);
      expect(r.code).toBe(0);
    } else {
      expect(r.out).toMatch(/^FAIL {2}voice 0 \(hum on hovercar\) \[instant Doppler\]/m);
      expect(r.out).toMatch(/voice 0 \(hum on hovercar\): error \d+\.\d cents at 5\.\d\d s > max 20 cents/);
      expect(r.code).toBe(1);
    }
  }, 120_000);
});

describe('ralenti check --audio', () => {
  // A car passing a listener at 40 m/s with a steady tone beside it; the tuning the engine renders with (engine-switch.ts).
  const scene = (tuning: unknown) => ({
    version: 1,
    duration: 3,
    sampleRate: 24000,
    tuning,
    sounds: { hum: { type: 'hum', frequency: 330, partials: [1, 0.5, 0.3], seconds: 2 }, beep: { type: 'tone', frequency: 500, seconds: 1 } },
    sources: { car: { motion: { type: 'line', from: [-60, 0, -10], velocity: [40, 0, 0] } } },
    voices: [
      { sound: 'hum', source: 'car', group: 'vehicles', loop: true, gain: 4 },
      { sound: 'beep', group: 'effects', loop: true, gain: 0.3 },
    ],
  });
  const tuning = JSON.parse(serializeTuning(engineTuning(defaultTuning)));

  it('judges the recorded mix against the script: the engine\'s own audio passes, a recording with Doppler factor 2 fails', async () => {
    const path = join(dir, 'mix.json');
    writeFileSync(path, JSON.stringify(scene(tuning)));
    const good = renderScene(scene(tuning));
    writeFileSync(join(dir, 'mix.wav'), writeWav({ sampleRate: good.sampleRate, channels: [good.left, good.right], encoding: 'float32' }));
    const wrong = renderScene(scene({ ...tuning, doppler: { ...tuning.doppler, factor: 2 } }));
    writeFileSync(join(dir, 'wrong.wav'), writeWav({ sampleRate: wrong.sampleRate, channels: [wrong.left, wrong.right], encoding: 'float32' }));
    const pass = await cli('check', path, '--audio', join(dir, 'mix.wav'), '--report', join(dir, 'mix.png'), '-q');
    expect(pass.out).toMatch(/^judged the recording .*mix\.wav$/m);
    expect(pass.out).toMatch(/^PASS {2}voice 0 \(hum on car\)/m);
    expect(pass.out).toMatch(/^PASS {2}voice 1 \(beep\)/m);
    // Where the car's harmonics come near the beep, the beep's frames are listed as overlap, not judged silently.
    expect(pass.out).toMatch(/not judged [\d.]+–[\d.]+ s: overlap/);
    expect(pass.code).toBe(0);
    expect(Array.from(readFileSync(join(dir, 'mix.png')).subarray(1, 4))).toEqual([80, 78, 71]); // "PNG"
    const fail = await cli('check', path, '--audio', join(dir, 'wrong.wav'), '-q');
    expect(fail.out).toMatch(/^FAIL {2}voice 0 \(hum on car\)/m);
    expect(fail.out).toMatch(/voice 0 \(hum on car\): .*\d\.\d\d s/);
    expect(fail.code).toBe(1);
  }, 60_000);

  it('refuses a missing recording as bad input (exit 3)', async () => {
    const path = join(dir, 'mix2.json');
    writeFileSync(path, JSON.stringify(scene(tuning)));
    const r = await cli('check', path, '--audio', join(dir, 'absent.wav'), '-q');
    expect(r.code).toBe(3);
    expect(r.err).toMatch(/cannot read .*absent\.wav: no such file/);
  });
});

describe('ralenti check errors', () => {
  const write = (name: string, content: unknown): string => {
    const path = join(dir, name);
    writeFileSync(path, typeof content === 'string' ? content : JSON.stringify(content));
    return path;
  };

  it.each<[string, () => string, number, RegExp, string[]?]>([
    ['a missing scene script', () => join(dir, 'no-such-folder', 'scene.json'), 3, /cannot read .*no-such-folder[\\/]scene\.json: ENOENT/],
    ['a script that is not JSON', () => write('syntax.json', '{"duration": 1,'), 3, /is not valid JSON/],
    ['a wrong type deep inside, by its JSON path', () => write('deep.json', { duration: 1, sounds: { t: { type: 'tone', frequency: 'high' } }, voices: [{ sound: 't' }] }), 3, /sounds\.t\.frequency: expected a finite number, got "high"/],
    ['an unknown voice sound, by its JSON path', () => write('horn.json', { duration: 1, voices: [{ sound: 'horn' }] }), 3, /voices\[0\]\.sound: no sound named "horn"/],
    ['a keyframe out of order, by its JSON path', () => write('keys.json', { duration: 1, sounds: { t: { type: 'tone', frequency: 200 } }, sources: { s: { motion: { type: 'keyframes', keys: [{ time: 1, position: [0, 0, 0] }, { time: 0, position: [1, 0, 0] }] } } }, voices: [{ sound: 't', source: 's' }] }), 3, /sources\.s\.motion\.keys\[1\]\.time: key times must increase/],
    ['a bad inline tuning, by its JSON path', () => write('tuning.json', { duration: 1, tuning: { version: 1, doppler: { factor: -1 } }, sounds: { t: { type: 'tone', frequency: 200 } }, voices: [{ sound: 't' }] }), 3, /tuning\.doppler/],
    ['a missing tuning file', () => write('no-tuning.json', { duration: 1, tuning: 'absent.tuning.json', sounds: { t: { type: 'tone', frequency: 200 } }, voices: [{ sound: 't' }] }), 3, /cannot read the tuning file .*absent\.tuning\.json/],
    ['a missing WAV file', () => write('no-wav.json', { duration: 1, sounds: { w: { type: 'file', path: 'absent.wav' } }, voices: [{ sound: 'w' }] }), 3, /sounds\.w\.path: cannot read .*absent\.wav/],
    ['sources with no tonal content (noise and a WAV file)', () => write('untuned.json', { duration: 1, sounds: { n: { type: 'noise', colour: 'pink' }, w: { type: 'file', path: 'tone.wav' } }, voices: [{ sound: 'n' }, { sound: 'w' }] }), 3, /no voice plays a tone or hum sound, so there is no pitch to check/],
    ['a tolerance out of range', () => write('ok.json', { duration: 1, sounds: { t: { type: 'tone', frequency: 200 } }, voices: [{ sound: 't' }] }), 2, /--tolerance-cents must be a number in 0\.1…1200/, ['--tolerance-cents', '0']],
  ])('rejects %s with exit code %s and a clear message', async (_name, path, code, pattern, extra = []) => {
    const r = await cli('check', path(), '-q', ...extra);
    expect(r.code).toBe(code);
    expect(r.err).toMatch(pattern);
    expect(r.out).toBe('');
  });

  it('fails (exit 1) a tonal voice that never reaches the listener, naming it', async () => {
    const path = write('far.json', {
      duration: 1,
      sampleRate: 16000,
      tuning: { version: 1, distance: { model: 'linear', refDistance: 1, maxDistance: 50, rolloffFactor: 1 } },
      sounds: { t: { type: 'tone', frequency: 300 } },
      sources: { far: { motion: { type: 'fixed', position: [0, 0, -500] } } },
      voices: [{ sound: 't', source: 'far', loop: true }],
    });
    const r = await cli('check', path, '-q');
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/FAIL {2}voice 0 \(t on far\) .*0 of \d+ sounding frames judged/);
    expect(r.out).toMatch(/voice 0 \(t on far\): no frame could be judged/);
    expect(r.out).toMatch(/1 of 1 voice\(s\) fail/);
  });
});
