// Resampler benchmark: the agreed quality metric and streaming throughput per tier, through the TypeScript reference
// kernel and the WebAssembly SIMD kernel ('-wasm' rows), beside libsamplerate-js "sinc fastest" / "sinc medium" and
// linear interpolation, all measured in the same run.
import { KernelTable, StreamReader, qualityTiers, resample, type KernelName, type QualityTierName } from '../src/dsp';
import { measure, metricMultisine, passbandInput, inputFramesNeeded, rejectionDb, passbandGainDb } from '../test/dsp/resampler-metric';
import { SINC_FASTEST, SINC_MEDIUM, libsamplerate, libsamplerateResample, linearInto, linearResample } from './resampler-reference';

const QUALITY_RATIOS = [0.5, 0.8, 1.25, 1.7, 2.5];
const SPEED_RATIOS = [0.5, 1.7];
const ROUNDS = 5;
const SLICE_MS = 300;
const BLOCK = 128;

type WasmTier = `${QualityTierName}-wasm`;
type Name = QualityTierName | WasmTier | 'sinc-fastest' | 'sinc-medium' | 'linear';
const wasmTiers: WasmTier[] = qualityTiers.map((t) => `${t}-wasm` as WasmTier);
/** Each of our rows: tier and kernel. */
const ours: { name: QualityTierName | WasmTier; tier: QualityTierName; kernel: KernelName }[] = [
  ...qualityTiers.map((tier) => ({ name: tier, tier, kernel: 'typescript' as KernelName })),
  ...qualityTiers.map((tier) => ({ name: `${tier}-wasm` as WasmTier, tier, kernel: 'wasm-simd' as KernelName })),
];
const names: Name[] = [...qualityTiers, ...wasmTiers, 'sinc-fastest', 'sinc-medium', 'linear'];

interface Speed {
  msps: number;
  voices: number;
  min: number;
  max: number;
}

function now(): number {
  return performance.now();
}

/** Output samples per second of a producer called repeatedly for SLICE_MS. */
function timeIt(step: () => number): number {
  let n = 0;
  step();
  const t0 = now();
  let t = t0;
  while (t - t0 < SLICE_MS) {
    n += step();
    t = now();
  }
  return n / ((t - t0) / 1000);
}

async function speedProducers(ratio: number): Promise<Record<Name, () => number>> {
  const src = metricMultisine();
  const out: Record<string, () => number> = {};
  for (const { name, tier, kernel } of ours) {
    const reader = new StreamReader({ table: KernelTable.forTier(tier), channels: 1, kernel });
    reader.setSource([src], { loop: true });
    const block = [new Float32Array(BLOCK)];
    out[name] = () => {
      for (let b = 0; b < 32; b++) reader.read(block, 0, BLOCK, ratio, ratio);
      return 32 * BLOCK;
    };
  }
  for (const [name, type] of [['sinc-fastest', SINC_FASTEST], ['sinc-medium', SINC_MEDIUM]] as const) {
    const conv = await libsamplerate(type, ratio);
    const chunk = Math.round(4096 * ratio);
    const dataOut = new Float32Array(8192);
    const len = { frames: 0 };
    let at = 0;
    out[name] = () => {
      if (at + chunk > src.length) at = 0;
      conv.full(src.subarray(at, at + chunk), dataOut, len);
      at += chunk;
      return len.frames;
    };
  }
  const lin = new Float32Array(32 * BLOCK);
  let pos = 0;
  out.linear = () => {
    pos = linearInto(src, ratio, pos, lin);
    return lin.length;
  };
  return out as Record<Name, () => number>;
}

function median(v: number[]): number {
  const s = [...v].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Runs the benchmark; prints tables unless `json`; returns the figures. */
export async function run(options: { json: boolean }): Promise<object> {
  const log = options.json ? () => {} : console.log;
  // Quality by the agreed metric.
  const quality: Record<string, Record<string, { rejectionDb: number; passbandDb: number }>> = {};
  for (const name of names) quality[name] = {};
  for (const r of QUALITY_RATIOS) {
    for (const { name, tier, kernel } of ours) quality[name][r] = measure((x, rr) => resample(x, rr, { quality: tier, kernel }), r);
    quality.linear[r] = measure(linearResample, r);
    for (const [name, type] of [['sinc-fastest', SINC_FASTEST], ['sinc-medium', SINC_MEDIUM]] as const) {
      const ms = await libsamplerateResample(metricMultisine().subarray(0, inputFramesNeeded(r) + 4096), r, type);
      const pb = await libsamplerateResample(passbandInput(r), r, type);
      quality[name][r] = { rejectionDb: rejectionDb(ms, r), passbandDb: passbandGainDb(pb, r) };
    }
  }
  log('Quality (agreed metric): rejection dB / passband error dB at 0.9 of the band edge');
  log(['', ...QUALITY_RATIOS.map((r) => `r=${r}`.padStart(16))].join(' '.padEnd(0)).replace(/^/, 'tier'.padEnd(14)));
  for (const name of names) {
    log(name.padEnd(14) + QUALITY_RATIOS.map((r) => `${quality[name][r].rejectionDb.toFixed(1)} / ${quality[name][r].passbandDb.toFixed(2)}`.padStart(17)).join(''));
  }
  // Throughput, interleaved rounds so that machine load hits every resampler alike.
  const samples: Record<string, Record<string, number[]>> = {};
  const ratioSamples: Record<string, Record<string, { fastest: number[]; medium: number[]; typescript: number[] }>> = {};
  for (const name of names) samples[name] = {};
  for (const r of SPEED_RATIOS) {
    const prod = await speedProducers(r);
    for (const name of names) samples[name][r] = [];
    for (const { name } of ours) (ratioSamples[name] ??= {})[r] = { fastest: [], medium: [], typescript: [] };
    for (let round = 0; round < ROUNDS; round++) {
      const got: Record<string, number> = {};
      for (const name of names) got[name] = timeIt(prod[name]);
      for (const name of names) samples[name][r].push(got[name]);
      for (const { name, tier } of ours) {
        ratioSamples[name][r].fastest.push(got[name] / got['sinc-fastest']);
        ratioSamples[name][r].medium.push(got[name] / got['sinc-medium']);
        ratioSamples[name][r].typescript.push(got[name] / got[tier]);
      }
    }
  }
  const speed: Record<string, Record<string, Speed>> = {};
  log(`\nThroughput, mono, ${BLOCK}-frame blocks (median of ${ROUNDS} interleaved rounds, [min–max]); voices = output samples/s ÷ 48000`);
  for (const name of names) {
    speed[name] = {};
    const cells: string[] = [];
    for (const r of SPEED_RATIOS) {
      const v = samples[name][r];
      speed[name][r] = { msps: median(v) / 1e6, voices: median(v) / 48000, min: Math.min(...v) / 48000, max: Math.max(...v) / 48000 };
      const s = speed[name][r];
      cells.push(`r=${r}: ${s.msps.toFixed(2)} MS/s ${s.voices.toFixed(0)} voices [${s.min.toFixed(0)}–${s.max.toFixed(0)}]`.padEnd(46));
    }
    log(name.padEnd(14) + cells.join(''));
  }
  type Ratio = { vsFastest: number; vsFastestRange: [number, number]; vsMedium: number; vsMediumRange: [number, number]; vsTypescript: number; vsTypescriptRange: [number, number] };
  const ratios: Record<string, Record<string, Ratio>> = {};
  const range = (v: number[]): [number, number] => [Math.min(...v), Math.max(...v)];
  const fmt = (v: number, rg: [number, number]) => `×${v.toFixed(2)} [${rg.map((q) => q.toFixed(2)).join('–')}]`;
  log('\nSame-run throughput ratios, ours / theirs (median [min–max] over rounds); -wasm rows also ÷ the TypeScript kernel');
  for (const { name } of ours) {
    ratios[name] = {};
    const cells: string[] = [];
    for (const r of SPEED_RATIOS) {
      const { fastest: f, medium: m, typescript: t } = ratioSamples[name][r];
      ratios[name][r] = { vsFastest: median(f), vsFastestRange: range(f), vsMedium: median(m), vsMediumRange: range(m), vsTypescript: median(t), vsTypescriptRange: range(t) };
      const x = ratios[name][r];
      const vsTs = name.endsWith('-wasm') ? `, ${fmt(x.vsTypescript, x.vsTypescriptRange)} ts` : '';
      cells.push(`r=${r}: ${fmt(x.vsFastest, x.vsFastestRange)} fastest, ${fmt(x.vsMedium, x.vsMediumRange)} medium${vsTs}`.padEnd(90));
    }
    log(name.padEnd(14) + cells.join(''));
  }
  const tables = Object.fromEntries(qualityTiers.map((t) => [t, { taps: KernelTable.forTier(t).taps, phases: KernelTable.forTier(t).phases }]));
  return { quality, speed, ratios, tables };
}
