// Checks of the WSOLA stretcher (src/stretch; docs/references.md §12) on harmonic tones, espeak-ng speech (§18) and a click train, against
// closed forms written here and against the Rubber Band library's command-line tool (outside reference).
import { describe, expect, it } from 'vitest';
import { stretchOffline, espeakSpeech, harmonicBurst, audibleSpan, rubberBandStretch, hasTool, aubioPitch } from './stretch-harness';
import { pitchErrorStats } from '../../src/analysis';
import { pitchErrorAgainstSource, melLogSpectralDistance, clickTrain, smearingMs } from './stretch-metrics';

const TONE_F0 = 180;
const SR = 48000;
const tone = harmonicBurst(TONE_F0, SR, 1);
const speechAvailable = hasTool('espeak-ng');
const speech = speechAvailable ? espeakSpeech('The convoy is two minutes out. Hold your position.') : null;
const rubberBandAvailable = hasTool('rubberband');

/** 1 → 0.25 over 0.5 s (from 0.3 s), held 1 s, back to 1 over 0.5 s. */
function glide(t: number): number {
  if (t < 0.3) return 1;
  if (t < 0.8) return 1 - (0.75 * (t - 0.3)) / 0.5;
  if (t < 1.8) return 0.25;
  if (t < 2.3) return 0.25 + (0.75 * (t - 1.8)) / 0.5;
  return 1;
}

/** Output time (s) at which ∫ speed dt reaches `sourceSeconds` (closed-form schedule integrated here, 1/sr steps). */
function glideTimeOf(sourceSeconds: number, sampleRate: number): number {
  let p = 0;
  let t = 0;
  while (p < sourceSeconds) {
    p += glide(t) / sampleRate;
    t += 1 / sampleRate;
  }
  return t;
}

const scales = [1, 0.5, 0.35, 0.25] as const;

describe('StretchReader on a harmonic tone (180 Hz, 8 harmonics)', () => {
  it.each(scales)('keeps every voiced frame within ±5 cents and the duration within half a percent at time scale %s', (s) => {
    const r = stretchOffline(tone, SR, () => s);
    const err = pitchErrorAgainstSource(tone, r.output, SR, (f) => r.positions[f]);
    // ±5 cents for end-to-end pitch-tracker checks: docs/references.md §10.
    expect(err.count).toBeGreaterThan(80 / s);
    expect(err.maxCents).toBeLessThanOrEqual(5);
    const [a0, a1] = audibleSpan(tone, SR);
    const [b0, b1] = audibleSpan(r.output, SR);
    expect(Math.abs((b1 - b0) / (a1 - a0) / (1 / s) - 1)).toBeLessThanOrEqual(0.005);
  });

  it('glides 1 → 0.25 → 1 with pitch kept, the duration the schedule gives, and no step above the sine-slope bound', () => {
    const r = stretchOffline(tone, SR, glide);
    const err = pitchErrorAgainstSource(tone, r.output, SR, (f) => r.positions[f]);
    expect(err.maxCents).toBeLessThanOrEqual(5);
    const [a0, a1] = audibleSpan(tone, SR);
    const [b0, b1] = audibleSpan(r.output, SR);
    const expected = (glideTimeOf(a1 / SR, SR) - glideTimeOf(a0 / SR, SR)) * SR;
    expect(Math.abs((b1 - b0) / expected - 1)).toBeLessThanOrEqual(0.005);
    // Largest step of Σ a_k·sin(2π k f0 t) is Σ a_k·2π k f0 / fs (common practice bound, 5 % margin, as test/dsp/stream-reader.test.ts).
    let bound = 0;
    for (let k = 1; k <= 8; k++) bound += (0.4 / k) * ((2 * Math.PI * k * TONE_F0) / SR);
    let worst = 0;
    for (let i = 1; i < r.output.length; i++) worst = Math.max(worst, Math.abs(r.output[i] - r.output[i - 1]));
    expect(worst).toBeLessThanOrEqual(bound * 1.05);
  });

  it('reproduces its input within float rounding at time scale 1 with pitch kept', () => {
    const r = stretchOffline(tone, SR, () => 1);
    let worst = 0;
    for (let i = 0; i < tone.length; i++) worst = Math.max(worst, Math.abs(r.output[i] - tone[i]));
    expect(worst).toBeLessThan(1e-6);
  });
});

describe.runIf(speechAvailable)('StretchReader on espeak-ng speech', () => {
  it.each([...scales, 'glide' as const])('keeps the pitch of steady voiced frames (median ≤ 3, 95th percentile ≤ 10 cents) at %s', (s) => {
    const { x, sampleRate } = speech!;
    const r = stretchOffline(x, sampleRate, s === 'glide' ? glide : () => s);
    const err = pitchErrorAgainstSource(x, r.output, sampleRate, (f) => r.positions[f], 10);
    console.log(`speech ${s}: pitch error over ${err.count} steady voiced frames: median ${err.medianCents.toFixed(2)}, p95 ${err.p95Cents.toFixed(2)}, max ${err.maxCents.toFixed(2)} cents`);
    expect(err.count).toBeGreaterThan(10);
    expect(err.medianCents).toBeLessThanOrEqual(3);
    expect(err.p95Cents).toBeLessThanOrEqual(10);
    if (s !== 'glide') {
      const [a0, a1] = audibleSpan(x, sampleRate);
      const [b0, b1] = audibleSpan(r.output, sampleRate);
      expect(Math.abs((b1 - b0) / (a1 - a0) / (1 / s) - 1)).toBeLessThanOrEqual(0.005);
    }
  });
});

describe.runIf(hasTool('aubiopitch'))('StretchReader cross-checked with an outside pitch tracker (aubio YIN)', () => {
  it.each([0.5, 0.25])('keeps every voiced frame of the harmonic tone within ±5 cents at time scale %s as aubio tracks it', (s) => {
    const r = stretchOffline(tone, SR, () => s);
    const a = aubioPitch(tone, SR);
    const b = aubioPitch(r.output, SR);
    const half = 512 / SR;
    const at = (t: number) => a.hz[Math.max(0, Math.min(a.hz.length - 1, Math.round(t / (128 / SR))))];
    const expected: number[] = [];
    const measured: number[] = [];
    for (let i = 0; i < b.times.length; i++) {
      const k = Math.round((b.times[i] + half) * SR);
      if (!(b.hz[i] > 0) || k >= r.positions.length) continue;
      const f = at(r.positions[k] / SR - half);
      // Steady frames only: the source's own track within 10 cents 20 ms either side (leaves out the edges).
      const before = at(r.positions[k] / SR - half - 0.02);
      const after = at(r.positions[k] / SR - half + 0.02);
      if (!(f > 0 && before > 0 && after > 0)) continue;
      if (Math.abs(1200 * Math.log2(before / f)) > 10 || Math.abs(1200 * Math.log2(after / f)) > 10) continue;
      expected.push(f);
      measured.push(b.hz[i]);
    }
    const err = pitchErrorStats(expected, measured);
    // aubio, an outside implementation (docs/references.md §18); ±5 cents end to end: §10.
    expect(err.count).toBeGreaterThan(300);
    expect(err.maxCents).toBeLessThanOrEqual(5);
  });
});

describe.runIf(rubberBandAvailable)('StretchReader against the Rubber Band library (rubberband-cli, default options)', () => {
  // Outside reference: the Rubber Band library's command-line tool, docs/references.md §18; the distance is §12 on mel bands (§18).
  // Margin: ours may be at most 1 dB worse than the outside reference in mean mel log-spectral distance to the input.
  const MARGIN_DB = 1;
  const materials = [
    { name: 'tone', x: tone, sampleRate: SR },
    ...(speech ? [{ name: 'speech', x: speech.x, sampleRate: speech.sampleRate }] : []),
  ];
  const cases = materials.flatMap((m) => [0.5, 0.25].map((s) => [m.name, s] as const));
  it.each(cases)('%s at time scale %s: mel log-spectral distance no more than 1 dB above the reference', (name, s) => {
    const m = materials.find((k) => k.name === name)!;
    const ours = stretchOffline(m.x, m.sampleRate, () => s).output;
    const ref = rubberBandStretch(m.x, m.sampleRate, s);
    const dOurs = melLogSpectralDistance(m.x, ours, m.sampleRate, s);
    const dRef = melLogSpectralDistance(m.x, ref, m.sampleRate, s);
    console.log(`${name} ${s}: mel LSD to the input, ours ${dOurs.toFixed(2)} dB, Rubber Band ${dRef.toFixed(2)} dB`);
    expect(dOurs).toBeLessThanOrEqual(dRef + MARGIN_DB);
  });

  it('measures transient smearing on a click train (energy-weighted RMS distance from the expected clicks, ms)', () => {
    const { x, clicks } = clickTrain(SR, 8, 0.1);
    for (const s of [0.5, 0.25]) {
      const ours = smearingMs(stretchOffline(x, SR, () => s).output, SR, clicks, s);
      const ref = smearingMs(rubberBandStretch(x, SR, s), SR, clicks, s);
      console.log(`click train ${s}: transient spread, ours ${ours.toFixed(1)} ms, Rubber Band ${ref.toFixed(1)} ms`);
      // WSOLA repeats a transient in the grains that overlap it: bounded by one hop (half the 40 ms grain).
      expect(ours).toBeLessThanOrEqual(20);
    }
  });
});
