// The gain and pan stage: channel gains (mapped gain × pan) in dB, per-sample linear ramps across a block
// (closed form), and the virtual/audible hysteresis (−90 dB down, −84 dB back; common practice).
import { describe, expect, it } from 'vitest';
import { VoiceGain, VIRTUAL_GAIN, RETURN_GAIN } from '../../src/engine/voice-gain';
import { createVoiceTargets } from '../../src/dilation';
import { VoiceEnvelope } from '../../src/engine/voice-envelope';

const SR = 48000;
const N = 128;

function targets(gain: number, left: number, right: number) {
  const t = createVoiceTargets();
  t.gain = gain;
  t.left = left;
  t.right = right;
  return t;
}

describe('VoiceGain', () => {
  it.each([
    { gain: 0.5, left: 1, right: 0.25 },
    { gain: 2, left: Math.SQRT1_2, right: Math.SQRT1_2 },
  ])('starts at gain × pan ($gain × $left / $right) after a jump', ({ gain, left, right }) => {
    const g = new VoiceGain(SR, 0.02);
    g.aim(targets(gain, left, right));
    g.jump();
    expect(g.left).toBeCloseTo(gain * left, 12);
    expect(g.right).toBeCloseTo(gain * right, 12);
  });

  it('ramps linearly from the last block end to this block end, times the envelope', () => {
    const g = new VoiceGain(SR, 0);
    g.aim(targets(1, 0.5, 0.25));
    g.jump();
    g.aim(targets(1, 1, 1));
    g.step(N);
    const env = new VoiceEnvelope(SR);
    env.begin(0.005, 0.01); // 240 frames: half way after 120
    env.step(false, 120);
    env.step(false, N); // 0.5 → 1
    expect(env.start).toBe(0.5);
    g.ramp(env, N);
    expect(g.left0).toBeCloseTo(0.25, 12);
    expect(g.leftStep).toBeCloseTo((1 - 0.25) / N, 12);
    expect(g.right0).toBeCloseTo(0.125, 12);
    expect(g.rightStep).toBeCloseTo((1 - 0.125) / N, 12);
  });

  it('goes virtual below −90 dB, stays virtual between, and comes back above −84 dB (reporting the return)', () => {
    const g = new VoiceGain(SR, 0);
    const steps: [number, boolean, boolean][] = [
      [0.5 * VIRTUAL_GAIN, true, false],
      [Math.sqrt(VIRTUAL_GAIN * RETURN_GAIN), true, false],
      [2 * RETURN_GAIN, false, true],
      [Math.sqrt(VIRTUAL_GAIN * RETURN_GAIN), false, false],
    ];
    for (const [level, virtual, returned] of steps) {
      g.aim(targets(level, 1, 1));
      g.step(N);
      expect(g.checkVirtual()).toBe(returned);
      expect(g.virtual).toBe(virtual);
    }
  });

  it('reads silence as exactly 0 at the −120 dB floor', () => {
    const g = new VoiceGain(SR, 0);
    g.aim(targets(0, 1, 1));
    g.jump();
    expect(g.left).toBe(0);
    expect(g.right).toBe(0);
  });
});
