// The stats report's peak covers every sample since the previous report, not only the last render quantum.
import { describe, expect, it } from 'vitest';
import { EngineHost } from '../../runtime/worklet/engine-host';
import type { Report } from '../../runtime/protocol';
import { defaultTuning } from '../../src/tuning/index';

describe('EngineHost peak reports', () => {
  it('shows a 2 ms click every 50 ms in every 0.25 s report, at the click’s own level', () => {
    const rate = 48000;
    const reports: Report[] = [];
    const h = new EngineHost({
      sampleRate: rate, startContextTime: 0,
      processorOptions: { capacity: 4, maxSounds: 4, tuning: defaultTuning, statsIntervalSeconds: 0.25 },
      post: (r) => reports.push(r),
    });
    // 50 ms loop: 2 ms of DC at 0.5, then silence (the interface group: exempt, no tone, 0 dB level).
    const loop = new Float32Array(rate / 20);
    loop.fill(0.5, 0, (2 * rate) / 1000);
    h.handle({ type: 'add-sound', sound: 1, channels: [loop], sampleRate: rate });
    h.handle({ type: 'play', voice: 1, sound: 1, options: { group: 'interface', loop: true, fadeInSeconds: 0 } });
    let outputPeak = 0;
    for (let b = 0; b < Math.ceil((2.1 * rate) / 128); b++) {
      const out = [new Float32Array(128), new Float32Array(128)];
      h.process(out);
      for (const c of out) for (const x of c) outputPeak = Math.max(outputPeak, Math.abs(x));
    }
    const peaks = reports.flatMap((r) => (r.type === 'stats' ? [r.stats.peakOut] : []));
    expect(peaks.length).toBe(8);
    // Every interval holds five clicks; each report's peak equals the loudest sample the host wrote.
    for (const p of peaks) expect(p).toBeCloseTo(outputPeak, 6);
    expect(outputPeak).toBeGreaterThan(0.1);
  });
});
