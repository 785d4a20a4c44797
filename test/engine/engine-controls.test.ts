// What a game controls beyond slow motion, rendered in Node and compared sample by sample: pause and resume,
// group volume, mute and solo, seek, voice events and state, per-play variation, per-source distance and cones.
import { describe, expect, it } from 'vitest';
import { engineAt, maxStep, renderFor, sine } from './engine-helpers';
import { FREEZE_FADE_SECONDS, voiceEventName, type Engine } from '../../src/engine';
import type { EngineSnapshot } from '../../src/index';

const SR = 48000;
const B = 128;
const listener = { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } };

/** A loop whose samples are distinct (a slow ramp plus a tone): any shift of the read head shows. */
function marker(seconds = 1): Float32Array {
  const n = Math.round(seconds * SR);
  return new Float32Array(n).map((_, i) => 0.2 * Math.sin((2 * Math.PI * 440 * i) / SR) + 0.2 * (i / n));
}

/** Renders `blocks` blocks of 128 frames; `each(k)` runs before block k. */
function blocks(engine: Engine, count: number, each?: (k: number) => void): [Float32Array, Float32Array] {
  return renderFor(engine, (count * B) / SR, B, (t) => each?.(Math.round((t * SR) / B)));
}

function drained(engine: Engine): { type: string; voice: number; time: number }[] {
  const out = new Float64Array(3 * 256);
  const n = engine.drainEvents(out);
  return Array.from({ length: n }, (_, k) => ({ type: voiceEventName(out[3 * k]), voice: out[3 * k + 1], time: out[3 * k + 2] }));
}

function maxDiff(a: Float32Array, b: Float32Array, from: number, to: number, shift = 0): number {
  let m = 0;
  for (let i = from; i < to; i++) m = Math.max(m, Math.abs(a[i] - b[i - shift]));
  return m;
}

describe('Engine pause and resume', () => {
  const fadeBlocks = Math.ceil((FREEZE_FADE_SECONDS * SR) / B);

  it('holds a paused voice where it was and resumes it in step, with the exempt interface group playing through', () => {
    const run = (pause: boolean) => {
      const engine = engineAt();
      const s = engine.addSound([marker()], SR);
      engine.play(s, { group: 'effects', loop: true, fadeInSeconds: 0 });
      const ui = engineAt();
      const us = ui.addSound([marker()], SR);
      ui.play(us, { group: 'interface', loop: true, fadeInSeconds: 0 });
      const each = (e: Engine) => (k: number) => {
        if (pause && k === 40) e.pause();
        if (pause && k === 100) e.resume();
      };
      return { world: blocks(engine, 200, each(engine))[0], ui: blocks(ui, 200, each(ui))[0] };
    };
    const paused = run(true);
    const ref = run(false);
    // The read head moves during the fade-out (fadeBlocks blocks) and holds until the resume: the rest is the reference, late by the hold.
    const hold = (100 - 40 - fadeBlocks) * B;
    expect(maxDiff(paused.world, ref.world, (100 + fadeBlocks + 1) * B, 200 * B, hold)).toBeLessThan(1e-6);
    // Silent while held.
    expect(maxDiff(paused.world, new Float32Array(paused.world.length), (40 + fadeBlocks + 1) * B, 100 * B)).toBe(0);
    // Click-free: no step larger than the signal's own (0.2·2π·440/48000 plus the ramp), through both fades.
    expect(maxStep(paused.world, 1)).toBeLessThan(0.2 * ((2 * Math.PI * 440) / SR) * 1.2 + 1e-4);
    // The interface group is exempt by its policy: untouched by the world pause.
    expect(maxDiff(paused.ui, ref.ui, 0, 200 * B)).toBe(0);
  });

  it('pauses one group on its own and keeps others playing; a group marked pausable is held by the world pause', () => {
    const engine = engineAt();
    const s = engine.addSound([marker()], SR);
    engine.play(s, { group: 'music', loop: true, fadeInSeconds: 0 });
    const [solo] = blocks(engine, 60);
    const both = engineAt();
    const s2 = both.addSound([marker()], SR);
    both.play(s2, { group: 'music', loop: true, fadeInSeconds: 0 });
    both.play(s2, { group: 'ambience', loop: true, fadeInSeconds: 0 });
    both.pause('ambience');
    const [mixed] = blocks(both, 60);
    expect(maxDiff(mixed, solo, (fadeBlocks + 1) * B, 60 * B)).toBeLessThan(1e-6);

    const ui = engineAt();
    const us = ui.addSound([marker()], SR);
    ui.play(us, { group: 'interface', loop: true, fadeInSeconds: 0 });
    ui.setGroupPausable('interface', true);
    ui.pause();
    const [held] = blocks(ui, 40);
    expect(maxDiff(held, new Float32Array(held.length), (fadeBlocks + 1) * B, 40 * B)).toBe(0);
  });

  it('holds a time-scale transition while the world is paused and continues it on resume', () => {
    const engine = engineAt();
    const scales: number[] = [];
    blocks(engine, 100, (k) => {
      if (k === 0) engine.setTimeScale({ target: 0, rampSeconds: (60 * B) / SR, easing: 'linear' });
      if (k === 30) engine.pause();
      if (k === 70) engine.resume();
      scales.push(engine.stats.timeScale);
    });
    // Linear ramp from 1 to 0 over 60 blocks of flow time (closed form): 30 blocks in, paused 40 blocks, then on.
    // scales[k] is read before block k, at engine time k blocks.
    expect(scales[30]).toBeCloseTo(1 - 30 / 60, 9);
    expect(scales[69]).toBeCloseTo(1 - 30 / 60, 9);
    expect(scales[85]).toBeCloseTo(1 - 45 / 60, 9);
  });
});

describe('Engine group buses', () => {
  it.each([
    [-6, Math.pow(10, -6 / 20)],
    [-20, 0.1],
    [6, Math.pow(10, 6 / 20)],
  ])('scales a group by its volume of %s dB (linear %s, the dB definition)', (db, linear) => {
    const run = (vol: boolean) => {
      const e = engineAt();
      const s = e.addSound([marker()], SR);
      e.play(s, { group: 'effects', loop: true, fadeInSeconds: 0, gain: 0.5 });
      if (vol) e.setGroupVolume('effects', db);
      return blocks(e, 40)[0];
    };
    const a = run(true);
    const b = run(false);
    let worst = 0;
    for (let i = 20 * B; i < 40 * B; i++) worst = Math.max(worst, Math.abs(a[i] - linear * b[i]));
    expect(worst).toBeLessThan(1e-5);
    expect(engineAt().getGroupState('effects')).toEqual({ volumeDb: 0, muted: false, solo: false, paused: false });
  });

  it('mutes a group (its voice goes virtual and comes back in step) and solo silences the other groups', () => {
    const e = engineAt();
    const s = e.addSound([marker()], SR);
    const v = e.play(s, { group: 'effects', loop: true, fadeInSeconds: 0 });
    const states: string[] = [];
    const [muted] = blocks(e, 160, (k) => {
      if (k === 10) e.setGroupMute('effects', true);
      if (k === 60) e.setGroupMute('effects', false);
      states.push(e.voiceState(v));
    });
    const ref = engineAt();
    ref.play(ref.addSound([marker()], SR), { group: 'effects', loop: true, fadeInSeconds: 0 });
    const [plain] = blocks(ref, 160);
    expect(states[40]).toBe('virtual');
    // Back in step once the unmute's dB glide (time constant 10 ms) has settled: 18 time constants later.
    expect(maxDiff(muted, plain, 140 * B, 160 * B)).toBeLessThan(1e-5);
    expect(drained(e).map((x) => x.type)).toEqual(['virtual', 'audible']);

    const so = engineAt();
    const s2 = so.addSound([marker()], SR);
    so.play(s2, { group: 'effects', loop: true, fadeInSeconds: 0 });
    so.play(s2, { group: 'music', loop: true, fadeInSeconds: 0 });
    so.setGroupSolo('music', true);
    const [soloed] = blocks(so, 40);
    const mo = engineAt();
    mo.play(mo.addSound([marker()], SR), { group: 'music', loop: true, fadeInSeconds: 0 });
    const [musicOnly] = blocks(mo, 40);
    expect(maxDiff(soloed, musicOnly, 20 * B, 40 * B)).toBeLessThan(1e-5);
    expect(so.getGroupState('music').solo).toBe(true);
  });
});

describe('Engine voice handles', () => {
  it('seeks a voice: after the fade it plays the sound from the new position', () => {
    const x = marker();
    const e = engineAt();
    const v = e.play(e.addSound([x], SR), { group: 'interface', loop: true, fadeInSeconds: 0 });
    let seekDone = -1;
    const [out] = blocks(e, 80, (k) => {
      if (k === 10) e.seek(v, 0.5);
      if (seekDone < 0 && k > 10 && e.voicePosition(v) >= 0.5 && e.voicePosition(v) < 0.51) seekDone = k;
    });
    expect(seekDone).toBeGreaterThan(10);
    // From two fades after the seek, output sample i is source sample 0.5 s + (i − jump frame).
    const jump = seekDone * B; // the head moved at the end of the block before seekDone was seen
    for (let i = (seekDone + 10) * B; i < 80 * B; i += 97) expect(out[i]).toBeCloseTo(x[24000 + i - jump], 6);
    expect(e.voicePosition(v)).toBeCloseTo(0.5 + (80 * B - jump) / SR, 9);
  });

  it('seeks a voice of a stretch group through its stretch stage', () => {
    const e = engineAt();
    const v = e.play(e.addSound([marker()], SR), { group: 'radio', loop: true, fadeInSeconds: 0 });
    blocks(e, 10, (k) => k === 2 && e.seek(v, 0.6));
    // 2 blocks, the seek's fade (one block past FREEZE_FADE_SECONDS), then the rest at speed 1 from 0.6 s.
    const after = (10 - 2 - Math.ceil((FREEZE_FADE_SECONDS * SR) / B)) * B;
    expect(e.voicePosition(v)).toBeCloseTo(0.6 + after / SR, 3);
  });

  it('reports states and ordered events: stopping then ended after stop, stolen then ended after a steal, ended for a finished one-shot', () => {
    const e = engineAt({ capacity: 1 });
    const s = e.addSound([sine(300, SR, 0.05)], SR);
    const shot = e.play(s, { group: 'effects' });
    expect(e.voiceState(shot)).toBe('playing');
    blocks(e, 30);
    expect(e.voiceState(shot)).toBe('ended');
    expect(e.voicePosition(shot)).toBe(-1);
    const loop = e.play(s, { group: 'effects', loop: true });
    blocks(e, 4);
    const newer = e.play(s, { group: 'effects', loop: true });
    expect(e.voiceState(loop)).toBe('stopping');
    blocks(e, 10);
    e.stop(newer, 0.01);
    expect(e.voiceState(newer)).toBe('stopping');
    blocks(e, 10);
    expect(drained(e).map((x) => `${x.type} ${x.voice === shot ? 'shot' : x.voice === loop ? 'loop' : 'newer'}`)).toEqual([
      'ended shot',
      'stolen loop',
      'ended loop',
      'ended newer',
    ]);
  });
});

describe('Engine per-play variation', () => {
  const play = (seed: number) => {
    const e = engineAt({ seed });
    const s = e.addSound([sine(500, SR, 1)], SR);
    const ratios: number[] = [];
    const gains: number[] = [];
    const mon = Array.from({ length: 16 }, () => ({ voice: 0, sourceId: 0, group: '', ratioCents: 0, dopplerCents: 0, radialSpeed: 0, distance: 0, cutoffHz: 0, gainDb: 0, virtual: false }));
    for (let i = 0; i < 12; i++) e.play(s, { group: 'interface', loop: true, pitchRange: [-200, 100], gainRange: [-6, 0] });
    const [out] = blocks(e, 8);
    const n = e.monitor(mon);
    for (let k = 0; k < n; k++) {
      ratios.push(mon[k].ratioCents);
      gains.push(mon[k].gainDb);
    }
    return { ratios, gains, out };
  };

  it('draws pitch within the cents range and gain within the dB range, the same for the same seed', () => {
    const a = play(7);
    const b = play(7);
    const c = play(8);
    expect(a.ratios).toEqual(b.ratios);
    expect(maxDiff(a.out, b.out, 0, a.out.length)).toBe(0);
    expect(a.ratios).not.toEqual(c.ratios);
    for (const r of a.ratios) expect(r >= -200 - 1e-6 && r <= 100 + 1e-6).toBe(true);
    for (const g of a.gains) expect(g >= -6 - 1e-6 && g <= 1e-6).toBe(true);
    // Spread: twelve uniform draws over 300 cents cover more than a third of the range.
    expect(Math.max(...a.ratios) - Math.min(...a.ratios)).toBeGreaterThan(100);
  });
});

describe('Engine per-source distance model and cones', () => {
  // Gains from the Web Audio API's formulas written out here (docs/references.md §5 distance, §16 cones).
  const inverse = (d: number, ref: number, rolloff: number) => ref / (ref + rolloff * (Math.max(d, ref) - ref));
  const cone = (angle: number, inner: number, outer: number, outerGain: number) =>
    angle <= inner / 2 ? 1 : angle >= outer / 2 ? outerGain : 1 - (angle - inner / 2) / (outer / 2 - inner / 2) + outerGain * ((angle - inner / 2) / (outer / 2 - inner / 2));

  it.each([
    ['source facing the listener', { x: 0, y: 0, z: 1 }, 0],
    ['source at 60° off axis', { x: Math.sin(Math.PI / 3), y: 0, z: Math.cos(Math.PI / 3) }, 60],
    ['source facing away', { x: 0, y: 0, z: -1 }, 180],
  ])('applies its own rolloff and cone: %s', (_name, orientation, angle) => {
    const run = (own: boolean) => {
      const e = engineAt();
      const s = e.addSound([marker()], SR);
      if (own) e.setSourceSpatial(3, { refDistance: 2, rolloffFactor: 0.5, coneInnerAngle: 60, coneOuterAngle: 180, coneOuterGain: 0.25, orientation });
      e.play(s, { group: 'interface', loop: true, fadeInSeconds: 0, sourceId: 3 });
      const snap: EngineSnapshot = { time: 0, listener, sources: [{ id: 3, position: { x: 0, y: 0, z: -8 }, velocity: { x: 0, y: 0, z: 0 } }] };
      return blocks(e, 30, (k) => k === 0 && e.pushSnapshot(snap))[0];
    };
    const own = run(true);
    const tuning = run(false);
    // The tuning's default: inverse, ref 1, rolloff 1. Ahead of the listener, so the pan is centred on both.
    const expected = (inverse(8, 2, 0.5) * cone(angle, 60, 180, 0.25)) / inverse(8, 1, 1);
    let worst = 0;
    for (let i = 15 * B; i < 30 * B; i++) worst = Math.max(worst, Math.abs(own[i] - expected * tuning[i]));
    expect(worst).toBeLessThan(1e-5);
  });

  it('refuses an invalid spatial object whole (counted)', () => {
    const e = engineAt();
    e.setSourceSpatial(1, { coneOuterGain: 2 });
    expect(e.stats.refused).toBe(1);
  });
});

describe('Engine routed group outputs', () => {
  it('moves a routed group out of the main mix into its own output, sample for sample, with its bus volume applied', () => {
    const run = (routed: boolean) => {
      const e = engineAt(routed ? { groupOutputs: ['music'] } : {});
      const s = e.addSound([marker()], SR);
      e.play(s, { group: 'music', loop: true, fadeInSeconds: 0 });
      e.play(s, { group: 'interface', loop: true, fadeInSeconds: 0, ratio: 0.5 });
      e.setGroupVolume('music', -6);
      const n = 40 * B;
      const main = [new Float32Array(n), new Float32Array(n)];
      const music = [new Float32Array(n), new Float32Array(n)];
      const l = new Float32Array(B);
      const r = new Float32Array(B);
      const gl = new Float32Array(B);
      const gr = new Float32Array(B);
      for (let o = 0; o < n; o += B) {
        e.render([l, r], B, [[gl, gr]]);
        main[0].set(l, o);
        main[1].set(r, o);
        music[0].set(gl, o);
        music[1].set(gr, o);
      }
      return { main, music };
    };
    const routed = run(true);
    const plain = run(false);
    // Main + routed = the unrouted mix (the limiter stays idle at these levels; master gain 0 dB).
    let worst = 0;
    for (let i = 0; i < plain.main[0].length; i++) worst = Math.max(worst, Math.abs(routed.main[0][i] + routed.music[0][i] - plain.main[0][i]));
    expect(worst).toBeLessThan(1e-6);
    expect(Math.max(...routed.music[0].map(Math.abs))).toBeGreaterThan(0.05);
    // Without routing nothing is written to the extra outputs.
    expect(Math.max(...plain.music[0].map(Math.abs))).toBe(0);
  });
});

describe('Engine controls on the audio path', () => {
  it('retains nothing over 20,000 blocks of pause, mute, solo, seek, cones, routed output and events', async () => {
    const { setFlagsFromString } = await import('node:v8');
    const { runInNewContext } = await import('node:vm');
    setFlagsFromString('--expose-gc');
    const gc = runInNewContext('gc') as () => void;
    const e = engineAt({ groupOutputs: ['music'], capacity: 8 });
    const s = e.addSound([marker(0.2)], SR);
    e.setSourceSpatial(4, { coneInnerAngle: 60, coneOuterAngle: 200, coneOuterGain: 0.3, orientation: { x: 0, y: 0, z: 1 }, rolloffFactor: 0.5 });
    const voices = [
      e.play(s, { group: 'music', loop: true }),
      e.play(s, { group: 'vehicles', loop: true, sourceId: 4 }),
      e.play(s, { group: 'interface', loop: true }),
    ];
    const snap: EngineSnapshot = { time: 0, listener, sources: [{ id: 4, position: { x: 3, y: 0, z: -5 }, velocity: { x: 1, y: 0, z: 0 } }] };
    e.pushSnapshot(snap);
    const l = new Float32Array(B);
    const r = new Float32Array(B);
    const routed = [[new Float32Array(B), new Float32Array(B)]];
    const events = new Float64Array(3 * 64);
    const cycle = (n: number) => {
      for (let k = 0; k < n; k++) {
        if (k % 50 === 0) e.pause();
        if (k % 50 === 25) e.resume();
        if (k % 40 === 10) e.setGroupMute('vehicles', (k / 40) % 2 < 1);
        if (k % 60 === 5) e.setGroupSolo('interface', (k / 60) % 2 < 1);
        if (k % 70 === 3) e.seek(voices[k % 3], 0.05);
        e.render([l, r], B, routed);
        e.drainEvents(events);
      }
    };
    cycle(4000);
    gc();
    const before = process.memoryUsage().heapUsed;
    cycle(20000);
    gc();
    const after = process.memoryUsage().heapUsed;
    // Any retention per block would show: 8 bytes × 20,000 blocks = 160 KB; V8's own bookkeeping stays far below that.
    expect(after - before).toBeLessThan(128 * 1024);
  });
});
