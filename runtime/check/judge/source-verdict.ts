// The verdict on one judged source: error figures over the judged frames, unjudged frames merged into spans with their
// reasons, the judged shares (overall and around closest approach), and failure messages that name the source and a
// time. Percentiles by Hyndman–Fan definition 7 (src/analysis quantileSorted).
import { quantileSorted } from '../../../src/analysis';
import type { JudgeInput, JudgedSource, SourceFigures, UnjudgedReason, UnjudgedSpan } from './judge-source';

/** Builds the verdict from per-frame times, expected and heard Hz, errors (cents, NaN where not judged) and reasons. */
export function verdict(
  input: JudgeInput,
  times: Float64Array,
  expected: Float64Array,
  heardHz: Float64Array,
  errors: Float64Array,
  reasons: (UnjudgedReason | 'judged' | 'silent')[],
  hop: number,
): JudgedSource {
  const lim = input.limits;
  const unjudged: UnjudgedSpan[] = [];
  const abs: number[] = [];
  let sounding = 0;
  let maxCents = NaN;
  let maxAt = NaN;
  let caSounding = 0;
  let caJudged = 0;
  const ca = input.closestApproach;
  for (let i = 0; i < times.length; i++) {
    const r = reasons[i];
    if (r === 'silent') continue;
    sounding++;
    const nearCa = ca !== null && Math.abs(times[i] - ca) <= lim.closestApproachSeconds;
    if (nearCa) caSounding++;
    if (r === 'judged') {
      const a = Math.abs(errors[i]);
      abs.push(a);
      if (!(a <= maxCents)) [maxCents, maxAt] = [a, times[i]];
      if (nearCa) caJudged++;
      continue;
    }
    const last = unjudged[unjudged.length - 1];
    if (last && last.reason === r && times[i] - last.to <= hop * 1.5) last.to = times[i];
    else unjudged.push({ from: times[i], to: times[i], reason: r });
  }
  abs.sort((a, b) => a - b);
  const figures: SourceFigures = {
    medianCents: quantileSorted(abs, 0.5),
    p95Cents: quantileSorted(abs, 0.95),
    maxCents,
    maxAt,
    soundingFrames: sounding,
    judgedFrames: abs.length,
    judgedShare: sounding > 0 ? abs.length / sounding : 0,
    closestApproachShare: ca !== null && caSounding > 0 ? caJudged / caSounding : NaN,
  };
  const failures: string[] = [];
  const at = (t: number): string => `${t.toFixed(2)} s`;
  if (abs.length === 0) failures.push(`${input.name}: no frame could be judged (${sounding} sounding frames)`);
  else {
    if (figures.p95Cents > lim.p95Cents) {
      const worst = worstSpan(times, errors, lim.p95Cents);
      failures.push(`${input.name}: 95th percentile error ${figures.p95Cents.toFixed(1)} cents > ${lim.p95Cents} cents, off from ${at(worst[0])} to ${at(worst[1])}`);
    }
    if (maxCents > lim.maxCents) failures.push(`${input.name}: error ${maxCents.toFixed(1)} cents at ${at(maxAt)} > max ${lim.maxCents} cents`);
    if (figures.judgedShare < lim.judgedShare) failures.push(`${input.name}: only ${(figures.judgedShare * 100).toFixed(0)} % of the sounding frames judged (floor ${(lim.judgedShare * 100).toFixed(0)} %)`);
  }
  if (ca !== null && caSounding > 0 && figures.closestApproachShare < lim.closestApproachShare) {
    const inside = unjudged.filter((s) => s.to >= ca - lim.closestApproachSeconds && s.from <= ca + lim.closestApproachSeconds);
    const why = inside.map((s) => `${s.reason} ${at(s.from)}–${at(s.to)}`).join(', ');
    failures.push(`${input.name}: only ${(figures.closestApproachShare * 100).toFixed(0)} % judged within ±${lim.closestApproachSeconds} s of closest approach at ${at(ca)} (floor ${(lim.closestApproachShare * 100).toFixed(0)} %): ${why}`);
  }
  return { name: input.name, times, expectedHz: expected, heardHz, errorCents: errors, unjudged, figures, closestApproach: ca, passed: failures.length === 0, failures };
}

/** First and last time where the error exceeds `limit` (s). */
function worstSpan(times: Float64Array, errors: Float64Array, limit: number): [number, number] {
  let a = NaN;
  let b = NaN;
  for (let i = 0; i < times.length; i++) {
    if (Math.abs(errors[i]) > limit) {
      if (Number.isNaN(a)) a = times[i];
      b = times[i];
    }
  }
  return [a, b];
}
