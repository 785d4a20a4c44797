// Sounds generated for scene scripts: sine tones, harmonic hums (additive synthesis), and seeded
// noise (xorshift32, Marsaglia, J. Stat. Softw. 8(14), 2003; pink by Paul Kellet's filter, common practice).
import type { SoundSpec } from './scene-types';

/** A decoded or generated sound: channel data at its own sample rate. */
export interface SoundBuffer {
  channels: Float32Array[];
  sampleRate: number;
  /** For tones and hums: the exact fundamental used (Hz), chosen so that a loop of the sound is seamless. */
  frequency: number | null;
}

/**
 * Generates a tone, hum or noise sound at `defaultRate` (Hz) unless the spec names its own rate.
 * Tones and hums hold a whole number of cycles, so the frequency may move by at most half a cycle
 * over the sound's length (e.g. 0.25 Hz for a 2 s sound).
 */
export function generateSound(spec: Exclude<SoundSpec, { type: 'file' }>, defaultRate: number): SoundBuffer {
  const rate = spec.sampleRate ?? defaultRate;
  const frames = Math.max(1, Math.round(spec.seconds * rate));
  const out = new Float32Array(frames);
  if (spec.type === 'noise') {
    fillNoise(out, spec.colour, spec.seed);
    normalise(out, spec.gain);
    return { channels: [out], sampleRate: rate, frequency: null };
  }
  const cycles = Math.max(1, Math.round((spec.frequency * frames) / rate));
  const f0 = (cycles * rate) / frames;
  const partials = spec.type === 'tone' ? [1] : spec.partials;
  let sum = 0;
  for (const a of partials) sum += a;
  for (let k = 0; k < partials.length; k++) {
    const a = (partials[k] / sum) * spec.gain;
    const h = k + 1;
    if (a === 0 || f0 * h >= rate / 2) continue; // keep every partial below Nyquist
    // Phase in whole cycles per frame count, computed exactly to keep loops seamless.
    const step = (h * cycles) % frames;
    for (let i = 0, ph = 0; i < frames; i++, ph = (ph + step) % frames) out[i] += a * Math.sin((2 * Math.PI * ph) / frames);
  }
  return { channels: [out], sampleRate: rate, frequency: f0 };
}

function fillNoise(out: Float32Array, colour: 'white' | 'pink' | 'brown', seed: number): void {
  let s = seed >>> 0 || 0x9e3779b9;
  let b0 = 0, b1 = 0, b2 = 0, b3 = 0, b4 = 0, b5 = 0, b6 = 0;
  let brown = 0;
  for (let i = 0; i < out.length; i++) {
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    const white = s / 2147483648 - 1;
    if (colour === 'white') out[i] = white;
    else if (colour === 'brown') {
      brown = 0.998 * brown + 0.02 * white; // leaky integrator keeps the walk bounded
      out[i] = brown;
    } else {
      b0 = 0.99886 * b0 + white * 0.0555179;
      b1 = 0.99332 * b1 + white * 0.0750759;
      b2 = 0.969 * b2 + white * 0.153852;
      b3 = 0.8665 * b3 + white * 0.3104856;
      b4 = 0.55 * b4 + white * 0.5329522;
      b5 = -0.7616 * b5 - white * 0.016898;
      out[i] = b0 + b1 + b2 + b3 + b4 + b5 + b6 + white * 0.5362;
      b6 = white * 0.115926;
    }
  }
}

function normalise(out: Float32Array, peak: number): void {
  let m = 0;
  for (let i = 0; i < out.length; i++) m = Math.max(m, Math.abs(out[i]));
  if (m > 0) for (let i = 0; i < out.length; i++) out[i] *= peak / m;
}
