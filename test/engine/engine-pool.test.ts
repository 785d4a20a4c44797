import { describe, expect, it } from 'vitest';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { engineAt, maxStep, renderFor, sine, tuningWith } from './engine-helpers';
import type { EngineSnapshot } from '../../src/index';

const SR = 48000;
const listener = { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } };

describe('Engine voice pool', () => {
  it('keeps exactly capacity audible voices after 10× capacity play requests, stealing the oldest equals', () => {
    const run = () => {
      const engine = engineAt({ capacity: 16 });
      const s = engine.addSound([sine(300, SR, 1, 0.01)], SR);
      const handles: number[] = [];
      for (let i = 0; i < 160; i++) handles.push(engine.play(s, { loop: true }));
      renderFor(engine, 0.1);
      return { handles, stats: { ...engine.stats }, engine };
    };
    const a = run();
    const b = run();
    expect(a.stats.activeVoices).toBe(16);
    expect(a.stats.steals).toBe(144);
    expect(a.handles).toEqual(b.handles);
    expect(a.handles.every((h) => h >= 0)).toBe(true);
    // The survivors are the 16 newest requests: stopping an old handle does nothing, a new one stops.
    a.engine.stop(a.handles[0], 0);
    a.engine.stop(a.handles[159], 0);
    renderFor(a.engine, 0.01);
    expect(a.engine.stats.activeVoices).toBe(15);
  });

  it('steals by priority: a full pool of high priority refuses a lower one and yields to a higher one', () => {
    const engine = engineAt({ capacity: 4 });
    const s = engine.addSound([sine(300, SR, 1, 0.01)], SR);
    for (let i = 0; i < 4; i++) engine.play(s, { loop: true, priority: 150 });
    expect(engine.play(s, { priority: 100 })).toBe(-1);
    expect(engine.stats.refused).toBe(1);
    expect(engine.play(s, { priority: 200 })).toBeGreaterThanOrEqual(0);
    expect(engine.stats.steals).toBe(1);
  });

  it('steals the least audible of equal priority first', () => {
    const engine = engineAt({ capacity: 3 });
    const s = engine.addSound([sine(300, SR, 1, 0.01)], SR);
    const loud = engine.play(s, { loop: true, gain: 1 });
    const quiet = engine.play(s, { loop: true, gain: 0.1 });
    const mid = engine.play(s, { loop: true, gain: 0.5 });
    renderFor(engine, 0.02);
    engine.play(s, { loop: true, gain: 0.5 });
    renderFor(engine, 0.05);
    const mon = Array.from({ length: 8 }, () => ({ voice: 0, sourceId: 0, group: '', ratioCents: 0, dopplerCents: 0, radialSpeed: 0, distance: 0, cutoffHz: 0, gainDb: 0, virtual: false }));
    const n = engine.monitor(mon);
    const alive = mon.slice(0, n).map((m) => m.voice);
    expect(alive).toContain(loud);
    expect(alive).toContain(mid);
    expect(alive).not.toContain(quiet);
  });

  // A click is a step far above what the signal itself makes: a 1 kHz sine of amplitude A steps at most
  // A·2π·1000/48000 per sample (common practice: bound the first difference).
  it.each([
    ['start', 0, 0],
    ['stop', 0.1, 0],
    ['steal', 0, 0.1],
  ])('stays click-free at voice %s (bounded sample step)', (_what, stopAt, stealAt) => {
    const amp = 0.3;
    const engine = engineAt({ capacity: 1 });
    const cosine = new Float32Array(SR).map((_, i) => amp * Math.cos((2 * Math.PI * 1000 * i) / SR)); // starts at its peak
    const s = engine.addSound([cosine], SR);
    const v = engine.play(s, { group: 'interface', loop: true });
    const [left] = renderFor(engine, 0.2, 128, (t) => {
      if (stopAt > 0 && t >= stopAt && t < stopAt + 0.002) engine.stop(v);
      if (stealAt > 0 && t >= stealAt && t < stealAt + 0.002) engine.play(s, { group: 'interface', loop: true, offsetSeconds: 0.00025 });
    });
    const natural = amp * ((2 * Math.PI * 1000) / SR); // non-positional voices have unit gain on both sides
    expect(maxStep(left)).toBeLessThan(natural * 1.6);
  });

  it('loops a whole-cycle loop region without a click', () => {
    const engine = engineAt();
    const x = sine(1000, SR, 0.5, 0.3);
    const s = engine.addSound([x], SR);
    engine.play(s, { group: 'interface', loop: true, loopStart: 480, loopEnd: 480 + 48 * 37, fadeInSeconds: 0 });
    const [left] = renderFor(engine, 0.3);
    expect(maxStep(left, 10)).toBeLessThan(0.3 * ((2 * Math.PI * 1000) / SR) * 1.01);
  });

  it('makes a far voice virtual and brings it back in step with a voice that was never virtual', () => {
    const run = (far: boolean) => {
      const engine = engineAt();
      const s = engine.addSound([sine(700, SR, 0.37)], SR);
      engine.play(s, { group: 'interface', loop: true, sourceId: 5 });
      let virtualSeen = 0;
      const [left] = renderFor(engine, 1, 128, (t) => {
        const away = far && t > 0.2 && t < 0.6;
        const snap: EngineSnapshot = { time: t, listener, sources: [{ id: 5, position: { x: away ? 1e6 : 2, y: 0, z: -1 }, velocity: { x: 0, y: 0, z: 0 } }] };
        engine.pushSnapshot(snap);
        virtualSeen = Math.max(virtualSeen, engine.stats.virtualVoices);
      });
      return { left, virtualSeen };
    };
    const moved = run(true);
    const still = run(false);
    expect(moved.virtualSeen).toBe(1);
    expect(still.virtualSeen).toBe(0);
    let worst = 0;
    for (let i = Math.round(0.85 * SR); i < SR; i++) worst = Math.max(worst, Math.abs(moved.left[i] - still.left[i]));
    expect(worst).toBeLessThan(1e-5);
  });

  it('does not grow the heap over 100,000 start/stop cycles with rendering', () => {
    setFlagsFromString('--expose-gc');
    const gc = runInNewContext('gc') as () => void;
    const engine = engineAt({ capacity: 32 });
    const s = engine.addSound([sine(400, SR, 0.05)], SR);
    const l = new Float32Array(128);
    const r = new Float32Array(128);
    const opts = { loop: true, gain: 0.2, group: 'effects' };
    const cycle = (n: number) => {
      for (let i = 0; i < n; i++) {
        const v = engine.play(s, opts);
        if (i % 4 === 0) engine.render([l, r], 128);
        engine.stop(v, i % 2 === 0 ? 0 : 0.001);
      }
    };
    cycle(20000);
    gc();
    const before = process.memoryUsage().heapUsed;
    cycle(100000);
    const after = process.memoryUsage().heapUsed;
    gc();
    const settled = process.memoryUsage().heapUsed;
    // Retained growth after collection: none beyond noise. Transient garbage (V8 boxes doubles returned from
    // calls that are not inlined) stays small per cycle; an array or closure per call would be far larger.
    // The bound leaves room for V8's own bookkeeping (feedback vectors, code metadata) that a loaded machine
    // can shift by tens of KB, yet any retention per cycle shows: 8 bytes × 100,000 cycles = 800 KB.
    expect(settled - before).toBeLessThan(512 * 1024);
    expect((after - before) / 100000).toBeLessThan(256);
    expect(engine.stats.errors).toBe(0);
  });

  it('renders without allocating: heap stays flat over many blocks of a busy positional scene', () => {
    setFlagsFromString('--expose-gc');
    const gc = runInNewContext('gc') as () => void;
    const engine = engineAt({ capacity: 16 });
    const s = engine.addSound([sine(400, SR, 0.5), sine(500, SR, 0.5)], SR);
    for (let i = 0; i < 16; i++) engine.play(s, { loop: true, gain: 0.1, sourceId: i % 4, group: i % 2 ? 'effects' : 'music' });
    const snap: EngineSnapshot = { time: 0, listener, sources: [0, 1, 2, 3].map((id) => ({ id, position: { x: id, y: 0, z: -5 } })) };
    const l = new Float32Array(128);
    const r = new Float32Array(128);
    const blocks = (n: number) => {
      for (let b = 0; b < n; b++) {
        if (b % 6 === 0) {
          snap.time = engine.time;
          for (const src of snap.sources) src.position.x += 0.3;
          engine.pushSnapshot(snap);
        }
        if (b % 100 === 0) engine.setTimeScale({ target: b % 200 === 0 ? 0.3 : 1, rampSeconds: 0.2, easing: 'smooth' });
        engine.render([l, r], 128);
      }
    };
    blocks(1800); // warm-up long enough for every path (propagation solves, ramps) to be compiled
    gc();
    const before = process.memoryUsage().heapUsed;
    blocks(1200);
    const after = process.memoryUsage().heapUsed;
    gc();
    const settled = process.memoryUsage().heapUsed;
    // Retention of 8 bytes per voice and block would show: 1,200 blocks × 16 voices × 8 B = 154 KB.
    expect(settled - before).toBeLessThan(128 * 1024);
    expect((after - before) / 1200 / 16).toBeLessThan(1024); // transient bytes per voice and block, see above
    expect(engine.stats.errors).toBe(0);
  });
});

describe('Engine master limiter', () => {
  const ceiling = Math.pow(10, -1 / 20); // the default tuning's ceiling, −1 dBFS

  it('keeps |out| ≤ ceiling and every sample finite under absurd input', () => {
    const engine = engineAt({ capacity: 64 });
    const wild = new Float32Array(4800).map((_, i) => (i % 97 === 0 ? NaN : i % 89 === 0 ? Infinity : i % 2 ? 1e30 : -1e6));
    const s = engine.addSound([wild], SR);
    const t = engine.addSound([sine(100, SR, 1, 1)], SR);
    for (let i = 0; i < 64; i++) engine.play(i % 2 ? s : t, { loop: true, gain: 16, ratio: i % 3 ? 3.9 : 0.01 });
    const [left, right] = renderFor(engine, 0.5, 128, (time) => {
      engine.setVoice(0, { gain: NaN, ratio: Infinity });
      engine.pushSnapshot({ time, timeScale: NaN, listener: { position: { x: NaN, y: 0, z: 0 }, forward: { x: 0, y: 0, z: 0 }, up: { x: 0, y: 0, z: 0 } }, sources: [] });
    });
    let peak = 0;
    let finite = true;
    for (let i = 0; i < left.length; i++) {
      finite &&= Number.isFinite(left[i]) && Number.isFinite(right[i]);
      peak = Math.max(peak, Math.abs(left[i]), Math.abs(right[i]));
    }
    expect(finite).toBe(true);
    expect(peak).toBeLessThanOrEqual(ceiling + 1e-7);
    expect(engine.stats.clamps).toBeGreaterThan(0);
    expect(engine.stats.errors).toBe(0);
  });

  it('limits a +12 dB sine to the ceiling and leaves a quiet one untouched', () => {
    for (const [amp, limited] of [[4, true], [0.3, false]] as const) {
      const engine = engineAt();
      const x = sine(440, SR, 1, amp);
      const s = engine.addSound([x], SR);
      engine.play(s, { group: 'interface', loop: true, fadeInSeconds: 0 });
      const [left] = renderFor(engine, 0.3);
      let peak = 0;
      for (const y of left) peak = Math.max(peak, Math.abs(y));
      if (limited) {
        expect(peak).toBeLessThanOrEqual(ceiling + 1e-7);
        expect(engine.stats.limiterDb).toBeLessThan(-6);
      } else {
        expect(peak).toBeCloseTo(0.3, 5);
        expect(engine.stats.limiterDb).toBe(0);
      }
    }
  });

  it('lets a tuning turn the limiter off, but the 0 dBFS hard ceiling and the non-finite guard still hold', () => {
    const engine = engineAt({ tuning: tuningWith((t) => (t.master.limiter = false)) });
    const s = engine.addSound([new Float32Array(480).fill(3).map((v, i) => (i === 7 ? NaN : v))], SR);
    engine.play(s, { group: 'interface', loop: true, fadeInSeconds: 0 });
    const [left] = renderFor(engine, 0.05);
    expect(Math.max(...left)).toBe(1);
    expect(left.every((v) => Number.isFinite(v))).toBe(true);
    expect(engine.stats.clamps).toBeGreaterThan(0);
  });
});
