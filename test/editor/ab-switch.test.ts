// Switching between tunings A and B while a voice plays (what the editor's A/B key does) glides: the output never
// steps by more than a sine's own largest sample-to-sample change would, so the switch cannot click.
import { describe, expect, it } from 'vitest';
import { Engine } from '../../src/engine/index';
import { defaultTuning, parseTuning, serializeTuning } from '../../src/index';

describe('A/B tuning switch in the engine', () => {
  it.each([
    ['level −12 dB and pitch ×0.5', (t: any) => ((t.groups.effects.level.keys = [{ x: 0, y: -12 }]), (t.groups.effects.pitch.keys = [{ x: 0, y: 0.5 }]))],
    ['tone cutoff 100 Hz', (t: any) => (t.groups.effects.tone.keys = [{ x: 0, y: 100 }])],
  ])('switches A → B → A on a playing voice without a step: %s', (_name, change) => {
    const rate = 48000;
    const f = 220;
    const amp = 0.25;
    const a = defaultTuning;
    const bJson = JSON.parse(serializeTuning(a));
    change(bJson);
    const b = parseTuning(bJson);
    const engine = new Engine({ sampleRate: rate, tuning: a, capacity: 4 });
    // One second of a 220 Hz sine: 220 whole cycles, so the loop point is seamless.
    const sine = new Float32Array(rate).map((_, i) => amp * Math.sin((2 * Math.PI * f * i) / rate));
    const sound = engine.addSound([sine], rate);
    engine.play(sound, { group: 'effects', loop: true, fadeInSeconds: 0 });
    const out = [new Float32Array(128), new Float32Array(128)];
    let prev = NaN;
    let worst = 0;
    const peaks = new Float64Array(600);
    for (let block = 0; block < 600; block++) {
      if (block === 150) engine.setTuning(b);
      if (block === 350) engine.setTuning(a);
      engine.render(out, 128);
      for (const x of out[0]) {
        if (prev === prev) worst = Math.max(worst, Math.abs(x - prev));
        prev = x;
        peaks[block] = Math.max(peaks[block], Math.abs(x));
      }
    }
    // B is heard: the level settles at least 6 dB lower while B plays, and comes back with A.
    expect(peaks[340]).toBeLessThan(0.5 * peaks[140]);
    expect(peaks[590]).toBeCloseTo(peaks[140], 2);
    // Largest step of p·sin(2πft) between samples is p·2·sin(πf/fs) (closed form), p the largest output level. Gains
    // ramp across a block and the filter crossfades, so the output stays near it (25 % margin for the filter's moving
    // phase); a switch that restarted, cut or jumped the voice would step by up to 2p, about 50 times more.
    const sineStep = Math.max(...peaks) * 2 * Math.sin((Math.PI * f) / rate);
    expect(worst).toBeLessThan(1.25 * sineStep);
  });
});
