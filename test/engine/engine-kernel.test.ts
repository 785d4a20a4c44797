// The engine on the WebAssembly SIMD kernel against the engine on the TypeScript reference kernel: same scene, same output.
import { describe, expect, it } from 'vitest';
import type { KernelName } from '../../src/index';
import { engineAt, renderFor, sine } from './engine-helpers';
import { line, renderScene, tone } from './propagation-helpers';

const SR = 48000;

/** A scene of four voices (mono and stereo, loops and a one-shot), ratios gliding per block and a slow-motion ramp (dilation tone). */
function scene(kernel: KernelName): { left: Float32Array; right: Float32Array; kernel: string } {
  const engine = engineAt({ kernel });
  const a = sine(220, SR, 0.7, 0.8);
  const b = sine(3100, SR, 0.4, 0.8);
  const noise = Float32Array.from({ length: 20000 }, (_, i) => 0.8 * Math.sin(i * 1.91) * Math.sin(i * 0.013));
  const mono = engine.addSound([a], SR);
  const stereo = engine.addSound([b, noise.subarray(0, b.length)], SR);
  const low = engine.addSound([noise], 24000);
  const voices = [
    engine.play(mono, { loop: true, gain: 0.25, ratio: 0.6 }),
    engine.play(stereo, { gain: 0.25, ratio: 1.7, group: 'vehicles' }),
    engine.play(low, { loop: true, loopStart: 100, loopEnd: 9000, gain: 0.25, ratio: 2.2 }),
    engine.play(mono, { loop: true, gain: 0.25, ratio: 1, group: 'interface' }),
  ];
  engine.setTimeScale({ target: 0.3, rampSeconds: 0.25, easing: 'linear' });
  let block = 0;
  const [left, right] = renderFor(engine, 0.5, 128, () => {
    block++;
    engine.setVoice(voices[0], { ratio: 0.2 + 3.5 * Math.abs(Math.sin(block * 0.05)) });
    engine.setVoice(voices[2], { ratio: 0.5 + 1.5 * Math.abs(Math.cos(block * 0.03)) });
  });
  return { left, right, kernel: engine.stats.kernel };
}

describe('Engine kernels', () => {
  it('reports the kernel in stats: wasm-simd by default in Node, typescript when forced', () => {
    expect(engineAt().stats.kernel).toBe('wasm-simd');
    expect(engineAt({ kernel: 'typescript' }).stats.kernel).toBe('typescript');
  });

  it('renders the same scene through both kernels within 1e-6 per sample', () => {
    const ts = scene('typescript');
    const wa = scene('wasm-simd');
    expect([ts.kernel, wa.kernel]).toEqual(['typescript', 'wasm-simd']);
    let worst = 0;
    let energy = 0;
    for (let i = 0; i < ts.left.length; i++) {
      worst = Math.max(worst, Math.abs(ts.left[i] - wa.left[i]), Math.abs(ts.right[i] - wa.right[i]));
      energy += ts.left[i] * ts.left[i];
    }
    expect(energy / ts.left.length).toBeGreaterThan(1e-3); // the scene is not silent
    expect(worst).toBeLessThanOrEqual(1e-6);
  });

  it('renders a propagating fly-by (per-sample read ratios, air low-pass) through both kernels within 1e-6 per sample', () => {
    const run = (kernel: KernelName) =>
      renderScene({ source: line([-24, 0, -5], [80, 0, 0]), listener: line([0, 0, 0], [0, 0, 0]), seconds: 0.6, exactVelocities: false, sound: tone(400, 12000, 1), soundRate: 12000, engine: { kernel } });
    const ts = run('typescript');
    const wa = run('wasm-simd');
    let worst = 0;
    for (let i = 0; i < ts.out.length; i++) worst = Math.max(worst, Math.abs(ts.left[i] - wa.left[i]), Math.abs(ts.right[i] - wa.right[i]));
    expect(Math.max(...ts.out.map(Math.abs))).toBeGreaterThan(1e-3);
    expect(worst).toBeLessThanOrEqual(1e-6);
  });
});
