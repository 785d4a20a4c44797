// Engine.dispose: module memory is handed back at once (and reused by the next engine), a disposed engine refuses
// every call (render: silence, counted), and memory growth caused by one engine never breaks another's render.
import { describe, expect, it } from 'vitest';
import { Engine, EngineClosedError } from '../../src/engine';
import { WasmKernel } from '../../src/dsp';
import { engineAt, renderFor, sine } from './engine-helpers';

const SR = 48000;

/** Names of Engine's public methods (keyof sees public members only). */
type EngineMethod = { [K in keyof Engine]: Engine[K] extends (...args: never[]) => unknown ? K : never }[keyof Engine];

/** An engine on the default kernel with a stereo sound of `seconds` playing (looped). */
function busyEngine(seconds: number): { engine: Engine; channels: Float32Array[] } {
  const engine = engineAt();
  const channels = [sine(300, SR, seconds), sine(450, SR, seconds)];
  const s = engine.addSound(channels, SR);
  engine.play(s, { loop: true, gain: 0.3, ratio: 0.8 });
  return { engine, channels };
}

describe('Engine.dispose', () => {
  const kernel = WasmKernel.shared();

  it.runIf(kernel !== null)('keeps module memory bounded over 40 create/render/dispose cycles', () => {
    const k = kernel!;
    busyEngine(0.5).engine.dispose(); // first use places the default tier's tables (shared by every engine)
    const inUse = k.bytesInUse;
    const memory = k.exports.memory.buffer.byteLength;
    for (let i = 0; i < 40; i++) {
      const { engine } = busyEngine(1 + (i % 3) * 0.25); // 1…1.5 s stereo: 384…576 KB resident per engine
      renderFor(engine, 0.02);
      expect(k.bytesInUse).toBeGreaterThan(inUse + 300_000);
      engine.dispose();
      expect(k.bytesInUse).toBe(inUse);
    }
    expect(k.exports.memory.buffer.byteLength).toBe(memory);
  });

  it.runIf(kernel !== null)("gives a disposed engine's resident sound region to the next engine's sound", () => {
    const k = kernel!;
    const a = busyEngine(0.7);
    const at = k.residentOf(a.channels[0]);
    expect(at).toBeGreaterThan(0);
    a.engine.dispose();
    expect(k.residentOf(a.channels[0])).toBe(0);
    const b = busyEngine(0.7);
    expect(k.residentOf(b.channels[0])).toBe(at);
    b.engine.dispose();
  });

  it.runIf(kernel !== null)('renders the same samples while another engine grows module memory', () => {
    const k = kernel!;
    const reference = busyEngine(1);
    const [refL, refR] = renderFor(reference.engine, 0.2);
    reference.engine.dispose();
    const watched = busyEngine(1);
    const first = renderFor(watched.engine, 0.1);
    // A long sound on another engine: module memory grows (its buffer detaches) between two renders of `watched`.
    const before = k.exports.memory.buffer;
    const other = engineAt();
    other.addSound([sine(200, SR, 30), sine(210, SR, 30)], SR);
    expect(k.exports.memory.buffer).not.toBe(before);
    const second = renderFor(watched.engine, 0.1);
    const n = first[0].length;
    for (let i = 0; i < n; i++) {
      expect(first[0][i]).toBe(refL[i]);
      expect(second[0][i]).toBe(refL[n + i]);
      expect(second[1][i]).toBe(refR[n + i]);
    }
    other.dispose();
    watched.engine.dispose();
  });

  it('is idempotent, and a later render outputs silence and counts each refused call', () => {
    for (const kernelName of ['auto', 'typescript'] as const) {
      const engine = engineAt({ kernel: kernelName });
      const s = engine.addSound([sine(440, SR, 0.5)], SR);
      engine.play(s, { loop: true });
      renderFor(engine, 0.01);
      engine.dispose();
      engine.dispose();
      expect(engine.disposed).toBe(true);
      const l = new Float32Array(128).fill(1);
      const r = new Float32Array(128).fill(1);
      const refused = engine.stats.refused;
      engine.render([l, r], 128);
      engine.render([l, r], 64);
      expect(l.every((x) => x === 0) && r.every((x) => x === 0)).toBe(true);
      expect(engine.stats.refused).toBe(refused + 2);
      expect(engine.stats.errors).toBe(0);
    }
  });

  // Every public method but render and dispose, with plausible arguments: each must throw EngineClosedError naming
  // itself. The type makes a new public method of Engine a compile error here until it is added.
  const calls: Record<Exclude<EngineMethod, 'render' | 'dispose'>, (e: Engine) => unknown> = {
    addSound: (e) => e.addSound([new Float32Array(16)], SR),
    removeSound: (e) => e.removeSound(0),
    play: (e) => e.play(0),
    stop: (e) => e.stop(0),
    setVoice: (e) => e.setVoice(0, { gain: 1 }),
    setTuning: (e) => e.setTuning(e.currentTuning),
    useTables: (e) => e.useTables([]),
    pushSnapshot: (e) => e.pushSnapshot({ time: 0, listener: { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } }, sources: [] }),
    setTimeScale: (e) => e.setTimeScale({ target: 0.5, rampSeconds: 0.1, easing: 'linear' }),
    teleport: (e) => e.teleport(0),
    drainShockwaves: (e) => e.drainShockwaves([]),
    pause: (e) => e.pause(),
    resume: (e) => e.resume(),
    setGroupPausable: (e) => e.setGroupPausable('music', false),
    setGroupVolume: (e) => e.setGroupVolume('music', -6),
    setGroupMute: (e) => e.setGroupMute('music', true),
    setGroupSolo: (e) => e.setGroupSolo('music', true),
    getGroupState: (e) => e.getGroupState('music'),
    seek: (e) => e.seek(0, 0),
    voiceState: (e) => e.voiceState(0),
    voicePosition: (e) => e.voicePosition(0),
    voiceSpeed: (e) => e.voiceSpeed(0),
    setSourceSpatial: (e) => e.setSourceSpatial(0, null),
    drainEvents: (e) => e.drainEvents(new Float64Array(3)),
    monitor: (e) => e.monitor([]),
  };

  it('refuses every other call after dispose with EngineClosedError naming the call', () => {
    const engine = engineAt();
    engine.dispose();
    for (const [name, call] of Object.entries(calls)) {
      let caught: unknown = null;
      try {
        call(engine);
      } catch (err) {
        caught = err;
      }
      expect(caught, name).toBeInstanceOf(EngineClosedError);
      expect((caught as EngineClosedError).field).toBe(`Engine.${name}`);
    }
  });
});
