// The source-read stage: a propagating voice waits for its sound, then starts so that its first frame plays at the
// arrival sample (the read moves back by the ratios it will read before it); a Mach-cone arrival skips emission.
import { describe, expect, it } from 'vitest';
import { SourceRead } from '../../src/engine/voice-source-read';
import { KernelTable } from '../../src/dsp';
import { createEmissionSolution, EMISSION_HISTORY } from '../../src/engine/emission-solver';

const table = KernelTable.forTier('draft', 48000);
const sound = [new Float32Array(48000)];

describe('SourceRead', () => {
  it('a propagating voice has not arrived at its start; a non-propagating one has', () => {
    const s = new SourceRead(table, 'typescript');
    s.start(sound, { startFrame: 100 }, true, 2);
    expect(s.arrived).toBe(false);
    expect(s.startTime).toBe(2);
    s.start(sound, { startFrame: 100 }, false, 2);
    expect(s.arrived).toBe(true);
    expect(s.position).toBe(100);
  });

  it.each([
    { frames: 10, ratio: 1, back: 10 },
    { frames: 32, ratio: 0.5, back: 16 },
    { frames: 0, ratio: 2, back: 0 },
  ])('arriving $frames frames into a block at ratio $ratio moves the read back by $back frames', ({ frames, ratio, back }) => {
    const s = new SourceRead(table, 'typescript');
    s.start(sound, { startFrame: 1000 }, true, 0);
    s.arriveAt(frames, 0);
    expect(s.arrived).toBe(true);
    expect(s.silentFrames).toBe(frames);
    s.arrive(new Float32Array(128).fill(ratio));
    expect(s.position).toBeCloseTo(1000 - back, 9);
    expect(s.silentFrames).toBe(0);
  });

  it('a Mach-cone arrival skips the emission it jumped over, at the first ratio', () => {
    const s = new SourceRead(table, 'typescript');
    s.start(sound, { startFrame: 0 }, true, 0);
    s.arriveAt(0, 300);
    s.arrive(new Float32Array(128).fill(0.75));
    expect(s.position).toBeCloseTo(225, 9);
  });

  it('a model switch mid-voice keeps the read where it is and counts as arrived', () => {
    const s = new SourceRead(table, 'typescript');
    s.start(sound, { startFrame: 500 }, true, 0);
    s.setPropagating(false);
    expect(s.arrived).toBe(true);
    expect(s.position).toBe(500);
    s.seek(42);
    expect(s.position).toBe(42);
  });

  it.each([
    { preTau: -0.001, tau: 0.001, silent: 64 },
    { preTau: -0.0005, tau: 0.0015, silent: 32 },
  ])('arrives where the emission time crosses the start, linearly between the block ends (τ $preTau → $tau s)', ({ preTau, tau, silent }) => {
    const s = new SourceRead(table, 'typescript');
    s.start(sound, { startFrame: 0 }, true, 0);
    const pre = createEmissionSolution();
    const sol = createEmissionSolution();
    pre.state = sol.state = EMISSION_HISTORY;
    pre.tau = preTau;
    sol.tau = tau;
    s.arriveFrom(pre, sol, 128, 0, 48000);
    expect(s.arrived).toBe(true);
    // k = floor(n · (start − τ_pre) / (τ − τ_pre)), the crossing of a linear emission time
    expect(s.silentFrames).toBe(silent);
  });

  it('a voice whose source never appears plays after the wait, not before', () => {
    const s = new SourceRead(table, 'typescript');
    s.start(sound, { startFrame: 0 }, true, 1);
    s.waitForSource(1.2, 0.25);
    expect(s.arrived).toBe(false);
    s.waitForSource(1.25, 0.25);
    expect(s.arrived).toBe(true);
  });
});
