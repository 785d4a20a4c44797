// Test signals generated in code: seeded noise, sines and harmonic tones, phase-integrated sweeps.
import { seededRandom } from '../../src/random';

export { seededRandom };

/** White noise, uniform in [−amplitude, amplitude), from a seed. */
export function whiteNoise(frames: number, seed: number, amplitude = 0.5): Float32Array {
  const rnd = seededRandom(seed);
  const x = new Float32Array(frames);
  for (let i = 0; i < frames; i++) x[i] = amplitude * (2 * rnd() - 1);
  return x;
}

/** Sum of harmonics 1…count of f0 (those below Nyquist), amplitude 0.5/k, fixed phases 0.7·k rad. */
export function harmonicTone(f0: number, sampleRate: number, frames: number, count: number): Float32Array {
  const x = new Float32Array(frames);
  for (let k = 1; k <= count && k * f0 < sampleRate / 2; k++) {
    const w = (2 * Math.PI * k * f0) / sampleRate;
    for (let i = 0; i < frames; i++) x[i] += (0.5 / k) * Math.sin(w * i + 0.7 * k);
  }
  return x;
}

/** Sine whose instantaneous frequency is frequencyAt(t) Hz, by trapezoidal phase integration per sample. */
export function phaseIntegrated(frequencyAt: (t: number) => number, sampleRate: number, frames: number, amplitude = 0.5): Float32Array {
  const x = new Float32Array(frames);
  let phase = 0;
  let prev = frequencyAt(0);
  for (let i = 0; i < frames; i++) {
    x[i] = amplitude * Math.sin(phase);
    const next = frequencyAt((i + 1) / sampleRate);
    phase += (Math.PI * (prev + next)) / sampleRate;
    if (phase > 2 * Math.PI) phase -= 2 * Math.PI;
    prev = next;
  }
  return x;
}
