// Fuzzing the runtime's calls where they reach the audio thread: random sequences of port messages (well formed
// with hostile numbers, malformed, or arbitrary values) and render quanta into an EngineHost. Nothing throws; every
// output sample is finite and within 0 dBFS (the hard ceiling holds whatever the tuning says), within the limiter's
// ceiling while it is on.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { EngineHost } from '../../runtime/worklet/engine-host';
import { encodeSnapshot } from '../../runtime/protocol';
import { defaultTuning, serializeTuning } from '../../src/tuning';
import { fuzz } from './fuzz-harness';

const RUNS = 60;
const wild = fc.oneof(fc.double(), fc.constantFrom(0, 1, -1, 1e30, -1e30, NaN, Infinity, -Infinity, 4, 1 / 64, 48000), fc.integer({ min: -5, max: 300 }));
const vec = fc.record({ x: wild, y: wild, z: wild });
const noLimiter = { ...JSON.parse(serializeTuning(defaultTuning)), master: { limiter: false, ceilingDb: -1, gainDb: 24 } };

const command = fc.oneof(
  fc.record({ type: fc.constant('add-sound'), sound: fc.integer({ min: 0, max: 9 }), sampleRate: wild, channels: fc.array(fc.array(wild, { maxLength: 64 }).map((a) => Float32Array.from(a)), { minLength: 1, maxLength: 3 }) }),
  fc.record({ type: fc.constant('remove-sound'), sound: fc.integer({ min: 0, max: 9 }) }),
  fc.record({
    type: fc.constant('play'),
    voice: fc.integer({ min: 0, max: 20 }),
    sound: fc.integer({ min: 0, max: 9 }),
    options: fc.record({ loop: fc.boolean(), gain: wild, ratio: wild, group: fc.constantFrom('effects', 'music', 'interface', 'nope', ''), sourceId: fc.integer({ min: -1, max: 5 }), offsetSeconds: wild, fadeInSeconds: wild }, { requiredKeys: ['loop'] }),
  }),
  fc.record({ type: fc.constant('stop'), voice: fc.integer({ min: 0, max: 20 }), fadeSeconds: wild }),
  fc.record({ type: fc.constant('set-voice'), voice: fc.integer({ min: 0, max: 20 }), gain: wild, ratio: wild }),
  fc.record({ time: wild, listener: fc.record({ position: vec, velocity: vec, forward: vec, up: vec }), sources: fc.array(fc.record({ id: fc.integer({ min: 0, max: 5 }), position: vec, velocity: vec }), { maxLength: 4 }) }).map((s) => ({
    type: 'snapshot',
    data: encodeSnapshot(s),
  })),
  fc.record({ type: fc.constant('time-scale'), request: fc.record({ target: wild, rampSeconds: wild, easing: fc.constantFrom('linear', 'smooth', 'bogus'), startTime: wild }) }),
  fc.record({ type: fc.constant('tuning'), tuning: fc.constantFrom(defaultTuning, noLimiter, { version: 1, master: 'loud' }) }),
  fc.record({ type: fc.constant('sync'), id: wild }),
  fc.anything({ maxDepth: 2 }),
);
const step = fc.oneof(command.map((c) => ({ message: c })), fc.integer({ min: 1, max: 40 }).map((blocks) => ({ blocks })));

describe('fuzz: runtime calls into the audio thread', () => {
  it(`${RUNS} sequences of up to 40 messages and render quanta: no throw, finite output within 0 dBFS`, async () => {
    let blocks = 0;
    const c = await fuzz('runtime calls (EngineHost messages)', fc.array(step, { minLength: 1, maxLength: 40 }), RUNS, 1804, (steps) => {
      const h = new EngineHost({ sampleRate: 48000, startContextTime: 0, processorOptions: { capacity: 8, maxSounds: 10, tuning: defaultTuning, statsIntervalSeconds: 0.05 }, post: () => {} });
      const out = [new Float32Array(128), new Float32Array(128)];
      let limiterOn = true;
      for (const s of steps) {
        if ('message' in s) {
          h.handle(s.message);
          const m = s.message as { type?: string; tuning?: unknown };
          if (m?.type === 'tuning' && m.tuning === noLimiter) limiterOn = false;
          if (m?.type === 'tuning' && m.tuning === defaultTuning) limiterOn = true;
          continue;
        }
        for (let b = 0; b < s.blocks; b++) {
          if (h.process(out) !== true) return 'process() did not keep the node alive';
          blocks++;
          const bound = limiterOn ? Math.pow(10, -1 / 20) + 1e-6 : 1;
          for (const ch of out) for (const v of ch) if (!(Math.abs(v) <= bound)) return `sample ${v} beyond ${bound}`;
        }
      }
    });
    console.log(`[fuzz] runtime calls rendered ${blocks} quanta`);
    expect(c.failures).toBe(0);
  });
});
