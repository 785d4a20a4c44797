import { describe, expect, it } from 'vitest';
import { EngineHost } from '../../runtime/worklet/engine-host';
import { encodeSnapshot, type Report } from '../../runtime/protocol';
import { defaultTuning } from '../../src/tuning/index';

function host(statsIntervalSeconds = 0.05) {
  const reports: Report[] = [];
  const h = new EngineHost({
    sampleRate: 48000,
    startContextTime: 2,
    processorOptions: { capacity: 4, maxSounds: 8, tuning: defaultTuning, statsIntervalSeconds },
    post: (r) => reports.push(r),
  });
  const out = () => [new Float32Array(128), new Float32Array(128)];
  const sine = new Float32Array(4800).map((_, i) => 0.5 * Math.sin((2 * Math.PI * 440 * i) / 48000));
  return { h, reports, out, sine };
}

const peak = (chs: Float32Array[]) => Math.max(...chs.map((c) => c.reduce((m, x) => Math.max(m, Math.abs(x)), 0)));

describe('EngineHost (audio-thread side)', () => {
  it('reports ready on construction', () => {
    const { reports } = host();
    expect(reports[0]).toEqual({ type: 'ready', sampleRate: 48000, capacity: 4 });
  });

  it('plays a sound uploaded under a main-thread handle and reports stats with main-thread voice handles', () => {
    const { h, reports, out, sine } = host();
    h.handle({ type: 'add-sound', sound: 5, channels: [sine], sampleRate: 48000 });
    h.handle({ type: 'play', voice: 42, sound: 5, options: { group: 'interface', loop: true } });
    let o = out();
    // Stats every 0.05 s = 2400 frames: the first report follows block 19 (2432 frames).
    for (let b = 0; b < 19; b++) h.process((o = out()));
    expect(peak(o)).toBeGreaterThan(0.1);
    const stats = reports.filter((r) => r.type === 'stats');
    expect(stats.length).toBeGreaterThan(0);
    const last = stats.at(-1)!;
    if (last.type !== 'stats') return;
    expect(last.stats.activeVoices).toBe(1);
    expect(last.voices.map((v) => v.voice)).toEqual([42]);
    expect(last.contextTime).toBeCloseTo(2 + (19 * 128) / 48000, 9);
  });

  it('reports a malformed command as an error and keeps rendering', () => {
    const { h, reports, out } = host();
    h.handle({ type: 'play', voice: 'x' });
    h.handle({ type: 'play', voice: 1, sound: 99, options: {} });
    const errors = reports.filter((r) => r.type === 'error');
    expect(errors.map((e) => e.type === 'error' && e.message)).toEqual(['play.voice: expected a handle', 'play: unknown sound 99']);
    expect(() => h.process(out())).not.toThrow();
    expect(h.errors).toBe(2);
  });

  it('never throws from process: a failing render gives silence, one report, and recovers on the next valid command', () => {
    const { h, reports, out, sine } = host();
    h.handle({ type: 'add-sound', sound: 1, channels: [sine], sampleRate: 48000 });
    h.handle({ type: 'play', voice: 1, sound: 1, options: { group: 'interface', loop: true } });
    const real = h.engine.render.bind(h.engine);
    h.engine.render = () => {
      throw new Error('injected');
    };
    const o = out();
    o[0].fill(1);
    expect(h.process(o)).toBe(true);
    expect(peak(o)).toBe(0);
    expect(h.faulted).toBe(true);
    h.engine.render = real;
    const still = out();
    h.process(still);
    expect(peak(still)).toBe(0);
    h.handle({ type: 'set-voice', voice: 1, gain: 1 });
    for (let b = 0; b < 10; b++) h.process(out());
    const back = out();
    h.process(back);
    expect(peak(back)).toBeGreaterThan(0.1);
    expect(reports.filter((r) => r.type === 'error').map((r) => r.type === 'error' && r.where)).toEqual(['process']);
  });

  it('limits error messages per stats interval while counting all of them', () => {
    const { h, reports } = host(10);
    for (let i = 0; i < 50; i++) h.handle({ type: 'bogus' });
    expect(h.errors).toBe(50);
    expect(reports.filter((r) => r.type === 'error').length).toBeLessThanOrEqual(4);
  });

  it('answers sync with the context time, and converts snapshot and ramp times from context to engine time', () => {
    const { h, reports, out } = host();
    h.process(out());
    h.handle({ type: 'sync', id: 3 });
    expect(reports.at(-1)).toEqual({ type: 'synced', id: 3, contextTime: 2 + 128 / 48000 });
    expect(h.toEngineTime(2.5)).toBeCloseTo(0.5, 12);
    const snap = encodeSnapshot({ time: 2.1, listener: { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } }, sources: [] });
    h.handle({ type: 'snapshot', data: snap });
    h.handle({ type: 'time-scale', request: { target: 0.5, rampSeconds: 0, easing: 'linear', startTime: 2 } });
    h.process(out());
    expect(h.engine.stats.timeScale).toBe(0.5);
    expect(h.errors).toBe(0);
  });
});

describe('EngineHost handle maps', () => {
  it('forgets voices that ended on their own, so 1000 one-shots leave no mapped handles', () => {
    const { h, out } = host(0.05);
    const click = new Float32Array(64).fill(0.1);
    h.handle({ type: 'add-sound', sound: 1, channels: [click], sampleRate: 48000 });
    for (let k = 0; k < 1000; k++) {
      h.handle({ type: 'play', voice: k + 1, sound: 1, options: { group: 'interface' } });
      expect(h.mappedVoices).toBeGreaterThan(0);
      h.process(out());
    }
    for (let b = 0; b < 40; b++) h.process(out());
    expect(h.mappedVoices).toBe(0);
    expect(h.errors).toBe(0);
  });
});
