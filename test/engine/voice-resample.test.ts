// The resample stage: the read advances by the ratio ramp's integral (frames × mean ratio, a closed form) whether it
// renders or skips; a propagating voice reads its per-sample ratios and is silent before its arrival sample.
import { describe, expect, it } from 'vitest';
import { SourceRead } from '../../src/engine/voice-source-read';
import { VoicePitch } from '../../src/engine/voice-pitch';
import { resampleBlock, skipBlock } from '../../src/engine/voice-resample';
import { createVoiceTargets } from '../../src/dilation';
import { KernelTable } from '../../src/dsp';

const SR = 48000;
const N = 128;
const table = KernelTable.forTier('draft', SR);
const sound = [Float32Array.from({ length: SR }, (_, i) => 0.5 * Math.sin(i / 10))];

function pitchAt(ratio: number): VoicePitch {
  const p = new VoicePitch(SR, 0, 0);
  const t = createVoiceTargets();
  t.ratio = ratio;
  p.aim(t);
  p.jump(t);
  p.step(t, N);
  return p;
}

describe('resampleBlock and skipBlock', () => {
  it.each([0.5, 1, 1.5])('reading and skipping at ratio %s advance the read by frames × ratio', (ratio) => {
    const read = new SourceRead(table, 'typescript');
    const skip = new SourceRead(table, 'typescript');
    read.start(sound, { startFrame: 1000 }, false, 0);
    skip.start(sound, { startFrame: 1000 }, false, 0);
    const p = pitchAt(ratio);
    const out = [new Float32Array(N)];
    resampleBlock(read, p, out, N, new Float32Array(N), 0, createVoiceTargets());
    skipBlock(skip, p, N, 0, createVoiceTargets());
    expect(read.position).toBeCloseTo(1000 + N * ratio, 6);
    expect(skip.position).toBeCloseTo(read.position, 9);
  });

  it('a propagating voice is silent before its arrival sample and sounds after it', () => {
    const s = new SourceRead(table, 'typescript');
    s.start(sound, { startFrame: 1000 }, true, 0);
    const out = [new Float32Array(N).fill(1)];
    resampleBlock(s, pitchAt(1), out, N, new Float32Array(N).fill(1), 40, createVoiceTargets());
    expect(out[0].subarray(0, 40).every((x) => x === 0)).toBe(true);
    expect(out[0].subarray(40).some((x) => x !== 0)).toBe(true);
  });

  it('skipping a propagating voice advances by the frames its ratios read', () => {
    const s = new SourceRead(table, 'typescript');
    s.start(sound, { startFrame: 1000 }, true, 0);
    skipBlock(s, pitchAt(1), N, 77.5, createVoiceTargets());
    expect(s.position).toBe(1077.5);
  });
});
