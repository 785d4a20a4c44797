// Faults in the host: the main-thread runtime wired to a real EngineHost through a structured-cloning fake port.
// An exception inside the engine is caught, the output is silent, the main thread hears about it, and the next valid
// command brings the sound back; a suspended and resumed context and a howler context replaced by Howler.unload()
// resume cleanly; uploads of the wrong channel count or sample rate are refused with a clear error.
import { describe, expect, it } from 'vitest';
import { Ralenti, RalentiOptionError, type RalentiAudioError } from '../../runtime/index';
import { EngineHost } from '../../runtime/worklet/engine-host';
import type { Report } from '../../runtime/protocol';
import { HowlerBridge } from '../../runtime/howler/index';
import { defaultTuning } from '../../src/tuning';
import { fakeContext } from '../runtime/fake-worklet-node';
import { fakeHowler } from '../runtime/fake-howler';

const SR = 48000;

/** A Ralenti whose port is an EngineHost in the same thread; messages are structured-cloned both ways, like a real port. */
function loopback(context: BaseAudioContext & { currentTime: number } = fakeContext(0)) {
  const errors: RalentiAudioError[] = [];
  const reports: Report[] = [];
  let host: EngineHost | null = null;
  let closed = false;
  const node = {
    onprocessorerror: null as (() => void) | null,
    connect: () => undefined,
    disconnect: () => undefined,
    port: {
      onmessage: null as ((e: MessageEvent) => void) | null,
      postMessage: (c: unknown, transfer: Transferable[] = []) => {
        if (!closed) host?.handle(structuredClone(c, { transfer }));
      },
      close: () => {
        closed = true;
      },
    },
  };
  host = new EngineHost({
    sampleRate: SR,
    startContextTime: context.currentTime,
    processorOptions: { capacity: 8, maxSounds: 8, tuning: defaultTuning, statsIntervalSeconds: 0.05 },
    post: (r) => {
      reports.push(r);
      node.port.onmessage?.({ data: structuredClone(r) } as MessageEvent);
    },
  });
  const ralenti = new Ralenti({ context, node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 8 });
  ralenti.onError((e) => errors.push(e));
  const l = new Float32Array(128);
  const r = new Float32Array(128);
  /** Renders `blocks` render quanta, advancing the context clock; returns the peak and largest step. */
  const render = (blocks: number, state = { last: 0 }) => {
    let peak = 0;
    let step = 0;
    let finite = true;
    for (let b = 0; b < blocks; b++) {
      l.fill(7); // a host that forgets to write would leave this
      host!.process([l, r]);
      for (let i = 0; i < 128; i++) {
        finite &&= Number.isFinite(l[i]) && Number.isFinite(r[i]);
        peak = Math.max(peak, Math.abs(l[i]), Math.abs(r[i]));
        step = Math.max(step, Math.abs(l[i] - state.last));
        state.last = l[i];
      }
      context.currentTime += 128 / SR;
    }
    return { peak, step, finite };
  };
  return { host, ralenti, errors, reports, render, context, isClosed: () => closed };
}

const tone = (hz = 220, amp = 0.3) => ({ channels: [new Float32Array(SR).map((_, i) => amp * Math.sin((2 * Math.PI * hz * i) / SR))], sampleRate: SR });

describe('worklet host faults', () => {
  it('silences the output when the engine throws inside render, tells the main thread, and recovers on the next valid command', () => {
    const { host, ralenti, errors, render } = loopback();
    const sound = ralenti.load(tone());
    ralenti.play(sound, { group: 'interface', loop: true });
    expect(render(20).peak).toBeGreaterThan(0.1);
    // A fault deep inside the engine (the mapper), not a replaced render: the engine catches it itself.
    const mapper = (host!.engine as unknown as { core: { mapper: { map: (...a: unknown[]) => unknown } } }).core.mapper;
    const real = mapper.map.bind(mapper);
    mapper.map = () => {
      throw new Error('injected mapper fault');
    };
    const during = render(30); // longer than one stats interval (0.05 s)
    expect(during.finite).toBe(true);
    expect(during.peak).toBe(0);
    expect(errors.length).toBeGreaterThan(0);
    expect(errors[0].where).toBe('process');
    expect(errors[0].message.length).toBeGreaterThan(10);
    expect(ralenti.stats.errors).toBeGreaterThan(0);
    mapper.map = real;
    // Still silent until the main thread sends something valid…
    expect(render(5).peak).toBe(0);
    ralenti.update();
    const after = render(20);
    expect(after.finite).toBe(true);
    expect(after.peak).toBeGreaterThan(0.1);
  });

  it('silences and reports a render that throws outright, keeps process() alive, and recovers on the next command', () => {
    const { host, ralenti, errors, render } = loopback();
    const sound = ralenti.load(tone());
    ralenti.play(sound, { group: 'interface', loop: true });
    render(5);
    const real = host!.engine.render.bind(host!.engine);
    host!.engine.render = () => {
      throw new RangeError('injected render fault');
    };
    expect(render(3).peak).toBe(0);
    expect(errors.map((e) => e.message)).toContain('injected render fault');
    host!.engine.render = real;
    ralenti.setTimeScale(1, { ramp: 0 });
    expect(render(20).peak).toBeGreaterThan(0.1);
  });

  it('reports malformed commands to the main thread without disturbing what plays', () => {
    const { host, ralenti, errors, render } = loopback();
    const sound = ralenti.load(tone());
    ralenti.play(sound, { group: 'interface', loop: true });
    render(5);
    host!.handle({ type: 'add-sound', sound: 9, channels: [new Float32Array(10), new Float32Array(10), new Float32Array(10)], sampleRate: SR });
    host!.handle({ type: 'add-sound', sound: 9, channels: [new Float32Array(10)], sampleRate: 1e9 });
    host!.handle({ type: 'add-sound', sound: 9, channels: [new Float64Array(10)], sampleRate: SR });
    expect(errors.map((e) => e.message)).toEqual([
      'add-sound.channels: expected 1 or 2 Float32Arrays',
      'add-sound.sampleRate: expected 1000…768000 Hz',
      'add-sound.channels: expected 1 or 2 Float32Arrays',
    ]);
    expect(render(10).peak).toBeGreaterThan(0.1);
  });
});

describe('context suspend and resume', () => {
  it('resumes without a click or a stale pitch after a suspension during which the game kept sending frames', () => {
    const run = (suspend: boolean) => {
      const { ralenti, render, context, errors } = loopback();
      const sound = ralenti.load(tone(330, 0.25));
      const src = ralenti.createSource();
      src.setPosition(0, 0, -3);
      ralenti.play(sound, { group: 'effects', loop: true, source: src });
      const state = { last: 0 };
      ralenti.update();
      const before = render(40, state);
      if (suspend) {
        // Suspended: the audio clock stops (no process calls, currentTime frozen) but the game loop runs on: 300 frames
        // with the same time stamp, the source moving, a slow-motion ramp requested.
        for (let k = 0; k < 300; k++) {
          src.setPosition(Math.sin(k / 30), 0, -3);
          ralenti.update();
        }
        ralenti.setTimeScale(0.5, { ramp: 0.1 });
        ralenti.setTimeScale(1, { ramp: 0.1 });
      }
      const after = render(80, state);
      return { before, after, errors, stats: ralenti.stats, timeScale: ralenti.timeScale, time: context.currentTime };
    };
    const calm = run(false);
    const resumed = run(true);
    expect(resumed.after.finite).toBe(true);
    expect(resumed.errors).toEqual([]);
    expect(resumed.after.peak).toBeGreaterThan(0.05);
    // No click: the largest step after resuming stays within the uninterrupted run's largest step (plus 20 %).
    expect(resumed.after.step).toBeLessThanOrEqual(Math.max(calm.after.step, calm.before.step) * 1.2);
    // Main-thread and audio-thread time flows agree after the resume.
    expect(resumed.stats.timeScale).toBeCloseTo(resumed.timeScale, 6);
    expect(resumed.stats.errors).toBe(0);
  });
});

describe('howler context replaced after Howler.unload()', () => {
  it('rebuilds the runtime on the new context, reloads sounds, and the new host plays while the old one hears nothing', async () => {
    const howler = fakeHowler();
    const built: ReturnType<typeof loopback>[] = [];
    const bridge = new HowlerBridge({
      howler,
      fetch: async () => ({ ok: true, status: 200, arrayBuffer: async () => new ArrayBuffer(64) }),
      create: async (ctx) => {
        const lb = loopback(ctx as unknown as BaseAudioContext & { currentTime: number });
        built.push(lb);
        return lb.ralenti;
      },
    });
    const first = await bridge.start();
    const sound = await bridge.loadSrc('rotor.wav');
    first.play(sound, { group: 'interface', loop: true });
    expect(built[0].render(10).peak).toBeGreaterThan(0.05);
    let restarted = 0;
    bridge.onRebuild((r) => {
      restarted++;
      r.play(sound, { group: 'interface', loop: true });
    });
    howler.unload();
    expect(bridge.check()).toBe(true);
    await new Promise((r) => setTimeout(r, 0));
    await new Promise((r) => setTimeout(r, 0));
    expect(bridge.rebuilds).toBe(1);
    expect(restarted).toBe(1);
    expect(built).toHaveLength(2);
    expect(bridge.ralenti).toBe(built[1].ralenti);
    expect(built[0].isClosed()).toBe(true);
    expect(() => first.play(sound)).toThrow(RalentiOptionError); // the old runtime refuses, clearly
    const fresh = built[1].render(20);
    expect(fresh.finite).toBe(true);
    expect(fresh.peak).toBeGreaterThan(0.05); // the fake decoder gives a 0.1 DC buffer
    expect(built[1].errors).toEqual([]);
    expect(bridge.check()).toBe(false); // once per replacement
  });
});

describe('buffer uploads', () => {
  const audioBuffer = (channels: number, sampleRate: number) =>
    ({ numberOfChannels: channels, sampleRate, length: 480, getChannelData: () => new Float32Array(480).fill(0.1) }) as unknown as AudioBuffer;

  it.each([
    ['no channels', 'load.channels', { channels: [], sampleRate: SR }],
    ['three channels', 'load.channels', { channels: [new Float32Array(4), new Float32Array(4), new Float32Array(4)], sampleRate: SR }],
    ['channels of different lengths', 'load.channels', { channels: [new Float32Array(4), new Float32Array(5)], sampleRate: SR }],
    ['an empty channel', 'load.channels', { channels: [new Float32Array(0)], sampleRate: SR }],
    ['a Float64Array channel', 'load.channels', { channels: [new Float64Array(4) as unknown as Float32Array], sampleRate: SR }],
    ['sample rate 0', 'load.sampleRate', { channels: [new Float32Array(4)], sampleRate: 0 }],
    ['sample rate NaN', 'load.sampleRate', { channels: [new Float32Array(4)], sampleRate: NaN }],
    ['sample rate negative', 'load.sampleRate', { channels: [new Float32Array(4)], sampleRate: -48000 }],
    ['sample rate 10 MHz', 'load.sampleRate', { channels: [new Float32Array(4)], sampleRate: 1e7 }],
    ['sample rate as a string', 'load.sampleRate', { channels: [new Float32Array(4)], sampleRate: '48000' as unknown as number }],
    ['a six-channel AudioBuffer', 'load.channels', audioBuffer(6, SR)],
    ['an AudioBuffer at 1 MHz', 'load.sampleRate', audioBuffer(1, 1e6)],
  ])('refuses %s with a RalentiOptionError naming %s and uploads nothing', (_what, field, data) => {
    const { ralenti, host } = loopback();
    let err: unknown;
    try {
      ralenti.load(data as never);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RalentiOptionError);
    expect((err as RalentiOptionError).field).toBe(field);
    expect((err as Error).message).toMatch(/expected/);
    expect(host!.errors).toBe(0);
  });
});
