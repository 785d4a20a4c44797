// The built-in 'radio' group with default settings: the sample scene's generated radio message slows to the
// built-in slow-motion scale and keeps its pitch.
import { describe, expect, it } from 'vitest';
import { Engine } from '../../src/engine';
import { defaultTuning } from '../../src/tuning';
import { radioMessageSound } from '../../sample-scene/radio-message';
import { pitchErrorAgainstSource } from './stretch-metrics';
import { BLOCK } from './stretch-harness';

describe("built-in 'radio' group (policy 'stretch')", () => {
  it('plays the radio message at the slow-motion scale with its pitch kept on steady voiced frames', () => {
    const sr = 48000;
    const s = defaultTuning.timeFlow.slowMotionScale;
    const sound = radioMessageSound(sr);
    const x = sound.channels[0];
    const engine = new Engine({ sampleRate: sr });
    engine.setTimeScale({ target: s, rampSeconds: 0, easing: 'linear' });
    engine.play(engine.addSound(sound.channels, sr), { group: 'radio', loop: true, fadeInSeconds: 0 });
    const frames = Math.floor((x.length * 0.6) / s / BLOCK) * BLOCK;
    const y = new Float32Array(frames);
    const l = new Float32Array(BLOCK);
    const r = new Float32Array(BLOCK);
    for (let o = 0; o < frames; o += BLOCK) {
      engine.render([l, r], BLOCK);
      y.set(l, o);
    }
    // The tone curve darkens the output at this scale: compare against the source at the same position; the
    // voice's position advances at the curve's speed (identity: s), so frame f reads source frame f·s.
    const err = pitchErrorAgainstSource(x, y, sr, (f) => f * s, 10);
    // ±5 cents for end-to-end pitch-tracker checks: docs/references.md §10 (median; 95th percentile ≤ 10 as for speech).
    expect(err.count).toBeGreaterThan(10);
    expect(err.medianCents).toBeLessThanOrEqual(5);
    expect(err.p95Cents).toBeLessThanOrEqual(10);
  });
});
