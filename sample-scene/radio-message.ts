// A looping radio message made in code: speech-like syllables from a glottal pulse train through three formant
// resonators (two-pole band-pass, the source-filter model of speech), noise for consonants, a radio band and squelch.
import type { Hz } from '../src/units';
import { seededRandom } from '../src/random';
import type { GeneratedSound } from './procedural-sounds';

/** Vowel formants F1, F2, F3 in Hz (adult speaker, common practice values). */
const VOWELS: readonly (readonly [number, number, number])[] = [
  [730, 1090, 2440], // a
  [270, 2290, 3010], // i
  [300, 870, 2240], // u
  [530, 1840, 2480], // e
  [570, 840, 2410], // o
];

/** Syllables of the message: vowel index, length in s, pitch in Hz, consonant noise before it (s). */
const SYLLABLES: readonly (readonly [number, number, number, number])[] = [
  [3, 0.16, 135, 0.04], [0, 0.22, 150, 0.05], [4, 0.18, 140, 0.03], [1, 0.14, 128, 0.05],
  [2, 0.2, 122, 0.0], [0, 0.26, 145, 0.06], [3, 0.15, 132, 0.04], [4, 0.3, 118, 0.05],
];

/** One two-pole resonator (band-pass around `f` Hz with bandwidth `bw` Hz), state kept between calls. */
class Resonator {
  private y1 = 0;
  private y2 = 0;
  /** Filters one sample with centre `f` Hz and bandwidth `bw` Hz at `sampleRate`. */
  step(x: number, f: number, bw: number, sampleRate: Hz): number {
    const r = Math.exp((-Math.PI * bw) / sampleRate);
    const a1 = 2 * r * Math.cos((2 * Math.PI * f) / sampleRate);
    const a2 = -r * r;
    const y = (1 - r) * x + a1 * this.y1 + a2 * this.y2;
    this.y2 = this.y1;
    this.y1 = y;
    return y;
  }
}

/** About 3.6 s: squelch, ~1.6 s of speech-like syllables, squelch, then quiet air; loops seamlessly. */
export function radioMessageSound(sampleRate: Hz): GeneratedSound {
  const rnd = seededRandom(1702);
  const frames = Math.round(3.6 * sampleRate);
  const out = new Float32Array(frames);
  const formants = [new Resonator(), new Resonator(), new Resonator()];
  const start = Math.round(0.12 * sampleRate);
  let t = start;
  let phase = 0;
  let prevVowel = VOWELS[0];
  for (const [v, len, f0, noise] of SYLLABLES) {
    const n = Math.round((len + noise) * sampleRate);
    const target = VOWELS[v];
    for (let i = 0; i < n && t < frames; i++, t++) {
      const u = i / n;
      const glide = Math.min(1, u * 4);
      const f = [0, 1, 2].map((k) => prevVowel[k] + (target[k] - prevVowel[k]) * glide);
      const inNoise = i < noise * sampleRate;
      // Glottal source: a pulse per period, pitch falling slightly through the syllable.
      phase += (f0 * (1.05 - 0.1 * u)) / sampleRate;
      let src = 0;
      if (phase >= 1) {
        phase -= 1;
        src = 1;
      }
      const voiced = inNoise ? 0.1 * src : src;
      const hiss = inNoise ? 0.25 * (2 * rnd() - 1) : 0.01 * (2 * rnd() - 1);
      const env = Math.min(1, u * 12) * Math.min(1, (1 - u) * 8);
      const x = (voiced + hiss) * env;
      out[t] = formants[0].step(x, f[0], 90, sampleRate) + 0.7 * formants[1].step(x, f[1], 110, sampleRate) + 0.35 * formants[2].step(x, f[2], 160, sampleRate);
    }
    prevVowel = target;
  }
  // Squelch bursts: 60 ms of noise at the start and after the message.
  const burst = (at: number) => {
    for (let i = 0; i < 0.06 * sampleRate && at + i < frames; i++) out[at + i] += 0.08 * (2 * rnd() - 1) * (1 - i / (0.06 * sampleRate));
  };
  burst(0);
  burst(t + Math.round(0.05 * sampleRate));
  // Radio band: one-pole high-pass near 300 Hz and low-pass near 3 kHz.
  let hp = 0;
  let prev = 0;
  let lp = 0;
  const ah = Math.exp((-2 * Math.PI * 300) / sampleRate);
  const al = Math.exp((-2 * Math.PI * 3000) / sampleRate);
  let peak = 0;
  for (let i = 0; i < frames; i++) {
    hp = ah * (hp + out[i] - prev);
    prev = out[i];
    lp = (1 - al) * hp + al * lp;
    out[i] = lp;
    peak = Math.max(peak, Math.abs(lp));
  }
  const scale = peak > 0 ? 0.5 / peak : 0;
  for (let i = 0; i < frames; i++) out[i] *= scale;
  return { channels: [out], sampleRate };
}
