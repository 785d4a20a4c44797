// Procedural sounds of the sample scene, made in code at start (additive and subtractive synthesis).
import type { Hz, Seconds } from '../src/units';
import { seededRandom } from '../src/random';

/** A mono sound as the runtime's `load` accepts it. */
export interface GeneratedSound {
  channels: Float32Array<ArrayBuffer>[];
  sampleRate: Hz;
}

/** Deterministic pseudo-random numbers in [−1, 1), so every start sounds the same. */
function noiseSource(seed: number): () => number {
  const rnd = seededRandom(seed);
  return () => 2 * rnd() - 1;
}

/** Length in frames of a loop holding a whole number of periods of `baseHz`, close to `seconds`. */
function loopFrames(sampleRate: Hz, baseHz: Hz, seconds: Seconds): number {
  const periods = Math.max(1, Math.round(seconds * baseHz));
  return Math.round((periods / baseHz) * sampleRate);
}

function mono(frames: number, sampleRate: Hz, fill: (out: Float32Array) => void): GeneratedSound {
  const out = new Float32Array(frames);
  fill(out);
  let peak = 0;
  for (let i = 0; i < frames; i++) peak = Math.max(peak, Math.abs(out[i]));
  const scale = peak > 0 ? 0.5 / peak : 0;
  for (let i = 0; i < frames; i++) out[i] *= scale;
  return { channels: [out], sampleRate };
}

/** Drone rotor: a bright 150 Hz harmonic stack with blade-rate flutter; loops seamlessly. */
export function droneSound(sampleRate: Hz): GeneratedSound {
  const base = 150;
  const frames = loopFrames(sampleRate, base / 6, 2);
  return mono(frames, sampleRate, (out) => {
    for (let i = 0; i < frames; i++) {
      const t = i / sampleRate;
      let s = 0;
      for (let h = 1; h <= 14; h++) s += Math.sin(2 * Math.PI * base * h * t) / h ** 0.9;
      out[i] = s * (0.75 + 0.25 * Math.sin(2 * Math.PI * (base / 6) * t));
    }
  });
}

/** Kart engine: a pulse-like 70 Hz firing tone with a rough second voice at 1.5×. */
export function kartSound(sampleRate: Hz): GeneratedSound {
  const base = 70;
  const frames = loopFrames(sampleRate, base / 2, 1.5);
  return mono(frames, sampleRate, (out) => {
    for (let i = 0; i < frames; i++) {
      const t = i / sampleRate;
      let s = 0;
      for (let h = 1; h <= 24; h++) s += (Math.sin(2 * Math.PI * base * h * t) * (h % 2 === 1 ? 1 : 0.55)) / h;
      s += 0.35 * Math.sin(2 * Math.PI * base * 1.5 * t);
      out[i] = Math.tanh(1.8 * s);
    }
  });
}

/** Buzzing orb: a 330 Hz square-ish buzz, amplitude-modulated at 11 Hz. */
export function orbSound(sampleRate: Hz): GeneratedSound {
  const base = 330;
  const frames = loopFrames(sampleRate, 11, 1);
  return mono(frames, sampleRate, (out) => {
    for (let i = 0; i < frames; i++) {
      const t = i / sampleRate;
      let s = 0;
      for (let h = 1; h <= 15; h += 2) s += Math.sin(2 * Math.PI * base * h * t) / h;
      out[i] = s * (0.6 + 0.4 * Math.sin(2 * Math.PI * 11 * t));
    }
  });
}

/** Generator hum: 100 Hz mains-like hum with its odd harmonics and a little seeded hiss. */
export function generatorSound(sampleRate: Hz): GeneratedSound {
  const base = 100;
  const frames = loopFrames(sampleRate, base, 2);
  const noise = noiseSource(7);
  return mono(frames, sampleRate, (out) => {
    let low = 0;
    for (let i = 0; i < frames; i++) {
      const t = i / sampleRate;
      low += 0.05 * (noise() - low);
      out[i] =
        Math.sin(2 * Math.PI * base * t) +
        0.5 * Math.sin(2 * Math.PI * base * 2 * t) +
        0.3 * Math.sin(2 * Math.PI * base * 3 * t) +
        0.15 * Math.sin(2 * Math.PI * base * 5 * t) +
        0.3 * low;
    }
  });
}

/** Interface click: a 2 kHz blip of 25 ms with a fast exponential decay. */
export function clickSound(sampleRate: Hz): GeneratedSound {
  const frames = Math.round(0.025 * sampleRate);
  return mono(frames, sampleRate, (out) => {
    for (let i = 0; i < frames; i++) {
      const t = i / sampleRate;
      out[i] = Math.sin(2 * Math.PI * 2000 * t) * Math.exp(-t / 0.004) + 0.4 * Math.sin(2 * Math.PI * 3100 * t) * Math.exp(-t / 0.002);
    }
  });
}

/** Music-like loop: an 8-step arpeggio (A minor pentatonic) over a soft bass, 4 s at 120 BPM. */
export function musicLoopSound(sampleRate: Hz): GeneratedSound {
  const step = 0.5;
  const notes = [57, 60, 64, 67, 69, 67, 64, 62];
  const bass = [45, 45, 48, 43];
  const frames = Math.round(notes.length * step * sampleRate);
  return mono(frames, sampleRate, (out) => {
    for (let i = 0; i < frames; i++) {
      const t = i / sampleRate;
      const n = Math.floor(t / step);
      const local = t - n * step;
      const f = 440 * 2 ** ((notes[n] - 69) / 12);
      const fb = 440 * 2 ** ((bass[Math.floor(n / 2)] - 69) / 12);
      const env = Math.min(1, local / 0.01) * Math.exp(-local / 0.18);
      const tri = (2 / Math.PI) * Math.asin(Math.sin(2 * Math.PI * f * t));
      const bassEnv = Math.min(1, (t % (2 * step)) / 0.02) * Math.min(1, (2 * step - (t % (2 * step))) / 0.02);
      out[i] = 0.6 * env * tri + 0.35 * bassEnv * Math.sin(2 * Math.PI * fb * t);
    }
  });
}
