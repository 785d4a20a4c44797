// Output levels of the command-line tool: gain from --gain or --normalize, and the clipping report.
import { dbToGain, gainToDb } from '../../src/dsp';
import { WAV_SAMPLE_BOUND, type SampleCounts, type WavEncoding } from '../offline';

/** Peak level --normalize scales to, dBFS. */
export const NORMALIZE_PEAK_DB = -1;

/** Linear gain from a --gain value in dB, or (when `peak` is given) the gain that puts `peak` at NORMALIZE_PEAK_DB. */
export function gainFromOptions(gainDb: number | undefined, peak: number | null): number {
  if (peak !== null) return peak > 0 && Number.isFinite(peak) ? dbToGain(NORMALIZE_PEAK_DB) / peak : 1;
  return dbToGain(gainDb ?? 0);
}

/** Lines reporting samples beyond 0 dBFS (clipped by integer encodings) and input samples clamped; '' when none. */
export function clipReport(out: SampleCounts, encoding: WavEncoding, inputClamped: number): string {
  let s = '';
  if (out.clamped > 0) {
    const peakDb = gainToDb(out.peak).toFixed(1);
    const what = encoding === 'float32' ? 'kept in the float file, but they clip on playback' : 'clipped to full scale';
    s += `clipping: ${out.clamped} sample(s) above 0 dBFS (peak +${peakDb} dBFS), ${what}; use --normalize or --gain -${Math.ceil(Number(peakDb) + 1)}\n`;
  } else s += 'clipping: none\n';
  if (inputClamped > 0) s += `input: ${inputClamped} sample(s) beyond ±${WAV_SAMPLE_BOUND} (+24 dBFS) or not finite were clamped\n`;
  return s;
}

/** Lets pending events (Ctrl+C, progress output) run between blocks. */
export function yieldToEvents(): Promise<void> {
  return new Promise((done) => setImmediate(done));
}
