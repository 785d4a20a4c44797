// Real recordings baked at speed 1.7 against the trusted resampler (libsamplerate-js, best sinc): a voice recording
// from Debian's alsa-utils (48 kHz) and espeak-ng speech (22.05 kHz), both installed by .ci/run (docs/references.md §20).
//
// The measure, defined here: ours and the reference are aligned by the integer lag (±16 samples) that maximises their
// cross-correlation; the difference signal and the reference are analysed by Welch's method (Kaiser β = 20 frames of
// 4096, hop 1024); in the band both resamplers promise to keep, 20 Hz to 0.9 · min(20 kHz, Nyquist), the difference's
// energy in each third of an octave (from 20 Hz up) is compared with the reference's energy over the whole band; the
// worst third, in dB, must be ≤ −90 dB (a fold confined to a few kHz counts in full, not diluted over the band).
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { besselI0, resample } from '../../src/dsp';
import { readWav } from '../../runtime/offline/wav';
import { libsamplerateResample } from '../../bench/resampler-reference';

/** libsamplerate's best sinc converter (its ConverterType 0). */
const SINC_BEST = 0;
const SPEED = 1.7;
const FRAME = 4096;

/** Welch power spectrum of `x` (Kaiser β = 20 frames of FRAME, hop FRAME/4), bins 0…FRAME/2. */
function welch(x: Float64Array): Float64Array {
  const fft = new FFT(FRAME);
  const i0 = besselI0(20);
  const w = Float64Array.from({ length: FRAME }, (_, i) => {
    const u = (2 * i) / (FRAME - 1) - 1;
    return besselI0(20 * Math.sqrt(Math.max(0, 1 - u * u))) / i0;
  });
  const acc = new Float64Array(FRAME / 2 + 1);
  const buf = new Float64Array(FRAME);
  const spec = fft.createComplexArray() as number[];
  for (let s = 0; s + FRAME <= x.length; s += FRAME / 4) {
    for (let i = 0; i < FRAME; i++) buf[i] = x[s + i] * w[i];
    fft.realTransform(spec, buf);
    for (let k = 0; k <= FRAME / 2; k++) acc[k] += spec[2 * k] * spec[2 * k] + spec[2 * k + 1] * spec[2 * k + 1];
  }
  return acc;
}

/** The measure above: worst third-octave difference energy over the reference's energy in 20 Hz … 0.9 · min(20 kHz, fs/2), dB. */
function differenceDb(ours: Float32Array, ref: Float32Array, fs: number): number {
  const n = Math.min(ours.length, ref.length);
  let lag = 0;
  let best = -Infinity;
  for (let l = -16; l <= 16; l++) {
    let c = 0;
    for (let i = 32; i < n - 32; i++) c += ours[i] * ref[i + l];
    if (c > best) [best, lag] = [c, l];
  }
  const d = new Float64Array(n - 64);
  const r = new Float64Array(n - 64);
  for (let i = 32; i < n - 32; i++) {
    d[i - 32] = ours[i] - ref[i + lag];
    r[i - 32] = ref[i + lag];
  }
  const pd = welch(d);
  const pr = welch(r);
  const lo = Math.ceil((20 * FRAME) / fs);
  const hi = Math.floor((0.9 * Math.min(20000, fs / 2) * FRAME) / fs);
  let er = 0;
  for (let k = lo; k <= hi; k++) er += pr[k];
  let worst = 0;
  for (let f = 20; f < (hi * fs) / FRAME; f *= Math.pow(2, 1 / 3)) {
    let ed = 0;
    for (let k = Math.max(lo, Math.ceil((f * FRAME) / fs)); k <= Math.min(hi, Math.floor((f * Math.pow(2, 1 / 3) * FRAME) / fs)); k++) ed += pd[k];
    worst = Math.max(worst, ed);
  }
  return 10 * Math.log10(worst / er);
}

function recordings(): { name: string; fs: number; samples: Float32Array }[] {
  const dir = mkdtempSync(join(tmpdir(), 'ralenti-speech-'));
  try {
    const speech = join(dir, 'speech.wav');
    // espeak-ng writes 22.05 kHz 16-bit mono WAV.
    execFileSync('espeak-ng', ['-w', speech, 'Slow motion should sound right at every sample rate: sixty-six sisters hiss, fizz and whistle.']);
    const files = [
      { name: 'alsa-utils Front_Center.wav (48 kHz voice)', path: '/usr/share/sounds/alsa/Front_Center.wav' },
      { name: 'espeak-ng speech (22.05 kHz)', path: speech },
    ];
    return files.map(({ name, path }) => {
      const wav = readWav(new Uint8Array(readFileSync(path)));
      return { name, fs: wav.sampleRate, samples: wav.channels[0] };
    });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

describe('real recordings baked at speed 1.7', () => {
  const cases = recordings();

  it('are at the rates the check asks for', () => {
    expect(cases.map((c) => c.fs)).toEqual([48000, 22050]);
  });

  it.each(cases.flatMap((c) => (['standard', 'high'] as const).map((tier) => [c.name, tier, c] as const)))(
    '%s at the %s tier differs from the trusted resampler by ≤ −90 dB in the kept band, with the same length',
    async (_name, tier, c) => {
      const ours = resample(c.samples, SPEED, { quality: tier, sampleRate: c.fs });
      const ref = await libsamplerateResample(c.samples, SPEED, SINC_BEST);
      expect(ours.length).toBe(Math.floor(c.samples.length / SPEED));
      expect(differenceDb(ours, ref, c.fs)).toBeLessThanOrEqual(-90);
    },
  );

  it('tells a weaker filter apart: the draft tier (a 65 dB design) differs by more than −90 dB on both', async () => {
    for (const c of cases) {
      const ref = await libsamplerateResample(c.samples, SPEED, SINC_BEST);
      expect(differenceDb(resample(c.samples, SPEED, { quality: 'draft', sampleRate: c.fs }), ref, c.fs)).toBeGreaterThan(-90);
    }
  });
});
