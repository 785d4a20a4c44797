// Pool flood: 10× capacity play requests before every block for 10,000 blocks. The engine's refusals and steals
// match a model of the documented stealing order (DEVELOPERS.md "Pool": lowest priority, then lowest target
// audibility, then oldest; a newcomer of lower priority, or equal priority and lower audibility, is refused,
// with a steal refused while every fade slot is busy), exactly capacity voices remain once the fades end, no steal
// makes a click, and the heap stays flat.
import { describe, expect, it } from 'vitest';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { Engine, engineDefaults, type VoiceMonitor } from '../../src/engine';
import { seededRandom } from '../../src/random';

const SR = 48000;
const CAPACITY = 16;
const BLOCKS = 10_000;
const BLOCK = 128;
const LEVEL = 0.01; // constant (DC) sound: its own sample step is 0, so every step comes from envelopes
const PRIORITIES = [50, 100, 150];
const GAINS = [0.5, 0.75, 1];

/** Seeded PRNG (mulberry32, common practice). */
const prng = seededRandom;

interface ModelVoice {
  handle: number;
  priority: number;
  audibility: number;
  sequence: number;
  /** Envelope, computed with the engine's arithmetic (fade steps per sample × block frames). */
  env: number;
}

const ATTACK_STEP = 1 / (engineDefaults.fadeInSeconds * SR);
const STEAL_STEP = 1 / (engineDefaults.stealFadeSeconds * SR);

/**
 * The documented pool policy, independently of the engine: `capacity` playing voices and `capacity` fade slots;
 * a victim that has sounded fades out in a fade slot, and when every fade slot is busy the newcomer is refused.
 */
class PoolModel {
  readonly playing: ModelVoice[] = [];
  readonly fading: number[] = [];
  steals = 0;
  refused = 0;
  /** Requests that would have needed a sounding voice cut at once (must stay 0). */
  cuts = 0;
  private sequence = 0;
  /** Whether a request is accepted; when it is, `commit` records its handle. */
  admit(priority: number, audibility: number): boolean {
    const free = 2 * CAPACITY - this.playing.length - this.fading.length;
    if (this.playing.length < CAPACITY) {
      if (free === 0) this.cuts++;
      return true;
    }
    let victim = 0;
    for (let i = 1; i < this.playing.length; i++) {
      const v = this.playing[i];
      const w = this.playing[victim];
      if (v.priority < w.priority || (v.priority === w.priority && (v.audibility < w.audibility || (v.audibility === w.audibility && v.sequence < w.sequence)))) victim = i;
    }
    const w = this.playing[victim];
    if (w.priority > priority || (w.priority === priority && w.audibility > audibility) || (w.env !== 0 && free === 0)) {
      this.refused++;
      return false;
    }
    this.playing.splice(victim, 1);
    if (w.env !== 0) this.fading.push(w.env);
    this.steals++;
    return true;
  }
  commit(handle: number, priority: number, audibility: number): void {
    this.playing.push({ handle, priority, audibility, sequence: this.sequence++, env: 0 });
  }
  /** Advances the envelopes by one rendered block. */
  rendered(frames: number): void {
    for (const v of this.playing) if (v.env < 1) v.env = Math.min(1, v.env + ATTACK_STEP * frames);
    let w = 0;
    for (let i = 0; i < this.fading.length; i++) {
      const e = Math.max(0, this.fading[i] - STEAL_STEP * frames);
      if (e > 0) this.fading[w++] = e;
    }
    this.fading.length = w;
  }
}

function gcFunction(): () => void {
  setFlagsFromString('--expose-gc');
  return runInNewContext('gc') as () => void;
}

describe('engine pool under a flood of play requests', () => {
  it('follows the documented stealing order for 10,000 blocks of 10× capacity requests, click-free, with a flat heap', () => {
    const gc = gcFunction();
    const engine = new Engine({ sampleRate: SR, capacity: CAPACITY });
    const dc = engine.addSound([new Float32Array(4800).fill(LEVEL)], SR);
    const model = new PoolModel();
    const random = prng(0xf100d);
    const l = new Float32Array(BLOCK);
    const r = new Float32Array(BLOCK);
    const monitors: VoiceMonitor[] = Array.from({ length: 4 * CAPACITY }, () => ({ voice: 0, sourceId: 0, group: '', ratioCents: 0, dopplerCents: 0, radialSpeed: 0, distance: 0, cutoffHz: 0, gainDb: 0, virtual: false }));
    const options = { group: 'interface', loop: true, gain: 1, priority: 100 };
    let mismatches = 0;
    let quietChecks = 0;
    let quietMismatches = 0;
    let maxVoicesRendered = 0;
    let previous = 0;
    let maxStep = 0;
    let nonFinite = 0;
    let heapBefore = 0;
    const render = () => {
      engine.render([l, r], BLOCK);
      model.rendered(BLOCK);
      for (let i = 0; i < BLOCK; i++) {
        const x = l[i];
        if (!Number.isFinite(x) || !Number.isFinite(r[i])) nonFinite++;
        const step = Math.abs(x - previous);
        if (step > maxStep) maxStep = step;
        previous = x;
      }
      const rendered = engine.stats.activeVoices + engine.stats.virtualVoices;
      if (rendered > maxVoicesRendered) maxVoicesRendered = rendered;
    };
    for (let b = 0; b < BLOCKS; b++) {
      if (b === 500) {
        gc();
        heapBefore = process.memoryUsage().heapUsed;
      }
      for (let k = 0; k < 10 * CAPACITY; k++) {
        options.priority = PRIORITIES[Math.floor(random() * PRIORITIES.length)];
        options.gain = GAINS[Math.floor(random() * GAINS.length)];
        const admitted = model.admit(options.priority, options.gain);
        const h = engine.play(dc, options);
        if (admitted !== h >= 0) mismatches++;
        if (admitted && h >= 0) model.commit(h, options.priority, options.gain);
      }
      render();
      if (b % 1000 === 999) {
        // Let the steal fades (10 ms) end, then the voices left are exactly the model's `capacity` survivors.
        for (let q = 0; q < 8; q++) render();
        const n = engine.monitor(monitors);
        quietChecks++;
        const alive = new Set<number>();
        for (let i = 0; i < n; i++) alive.add(monitors[i].voice);
        if (n !== CAPACITY || model.playing.some((v) => !alive.has(v.handle))) quietMismatches++;
      }
    }
    gc();
    const heapAfter = process.memoryUsage().heapUsed;

    expect(mismatches).toBe(0);
    expect(model.cuts).toBe(0);
    expect(quietChecks).toBe(10);
    expect(quietMismatches).toBe(0);
    expect(model.playing).toHaveLength(CAPACITY);
    expect(engine.stats.steals).toBe(model.steals);
    expect(engine.stats.refused).toBe(model.refused);
    expect(model.steals).toBeGreaterThan(2 * BLOCKS); // the flood really stole, and often
    expect(model.refused).toBeGreaterThan(100_000); // and really refused
    // At most `capacity` playing plus `capacity` fading voices are ever mixed.
    expect(maxVoicesRendered).toBeLessThanOrEqual(2 * CAPACITY);
    expect(nonFinite).toBe(0);
    // Step bound: every sounding voice changes its envelope by at most 1/(3 ms · SR) per sample (fade-in; steal and
    // stop fades are slower), so the mix of ≤ 2·capacity DC voices of level LEVEL·gain steps by at most this much.
    // A stolen voice cut without a fade would step by LEVEL·gain ≥ 0.005 at once, 2.25× this bound.
    const bound = 2 * CAPACITY * LEVEL * (1 / (engineDefaults.fadeInSeconds * SR));
    expect(maxStep).toBeGreaterThan(0);
    expect(maxStep).toBeLessThanOrEqual(bound * (1 + 1e-4));
    // Heap: no growth retained across 9,500 flooded blocks beyond collector noise.
    expect(heapAfter - heapBefore).toBeLessThan(256 * 1024);
    console.log(
      `pool flood: ${BLOCKS} blocks × ${10 * CAPACITY} requests, ${model.steals} steals, ${model.refused} refused, ` +
        `max step ${maxStep.toExponential(3)} (bound ${bound.toExponential(3)}), heap ${(heapBefore / 1048576).toFixed(2)} → ${(heapAfter / 1048576).toFixed(2)} MiB`,
    );
  }, 180_000);
});
