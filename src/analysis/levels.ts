// Signal levels: root-mean-square and peak amplitude, in linear units and in dB re 1 (full scale).
import type { Decibels } from '../units';
import { gainToDb } from '../dsp';

/** Root-mean-square of signal[start … end) (default the whole signal); 0 for an empty range. */
export function rmsLevel(signal: ArrayLike<number>, start = 0, end: number = signal.length): number {
  const lo = Math.max(0, start);
  const hi = Math.min(signal.length, end);
  if (hi <= lo) return 0;
  let sum = 0;
  for (let i = lo; i < hi; i++) sum += signal[i] * signal[i];
  return Math.sqrt(sum / (hi - lo));
}

/** Largest absolute sample of signal[start … end) (default the whole signal); 0 for an empty range. */
export function peakLevel(signal: ArrayLike<number>, start = 0, end: number = signal.length): number {
  let peak = 0;
  for (let i = Math.max(0, start), hi = Math.min(signal.length, end); i < hi; i++) {
    const a = Math.abs(signal[i]);
    if (a > peak) peak = a;
  }
  return peak;
}

/** RMS level in dB re 1 (a full-scale square wave reads 0 dB, a full-scale sine −3.01 dB); −Infinity for silence. */
export function rmsDb(signal: ArrayLike<number>, start = 0, end: number = signal.length): Decibels {
  return gainToDb(rmsLevel(signal, start, end));
}

/** Peak level in dB re 1 (dBFS); −Infinity for silence. */
export function peakDb(signal: ArrayLike<number>, start = 0, end: number = signal.length): Decibels {
  return gainToDb(peakLevel(signal, start, end));
}
