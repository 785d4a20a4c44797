// Resampler at every output rate (issue 19), all in one run: sweep rejection and passband per (rate, speed, tier) beside
// libsamplerate-js (sinc medium and fastest) measured by the same code; the offline resample() and resampleChunks()
// against the streaming reader and libsamplerate's fastest sinc; and the cost of one table-install slice on the audio thread.
import { KernelTable, StreamReader, WasmKernel, INSTALL_BYTES_PER_QUANTUM, packKernelTable, resample, resampleChunks, type QualityTierName } from '../src/dsp';
import { globalWasmApi } from '../src/dsp/wasm/wasm-kernel';
import { seededRandom } from '../src/random';
import { passbandDb, passbandSine, sweepInput, sweepRejectionDb } from '../test/dsp/sweep-metric';
import { metricMultisine } from '../test/dsp/resampler-metric';
import { SINC_FASTEST, SINC_MEDIUM, libsamplerate, libsamplerateResample } from './resampler-reference';

const RATES = [22050, 32000, 44100, 48000, 96000];
const rand = seededRandom(2019);
/** Named speeds and four no one named (seeded, log-uniform in 0.25…4), each exact for libsamplerate (input rate round(48000 · r)). */
const SPEEDS = [0.25, 0.5, 0.8, 1.25, 1.7, 2.5, 4, ...[0, 1, 2, 3].map(() => Math.exp(Math.log(0.25) + rand() * Math.log(16)))]
  .map((r) => Math.round(48000 * r) / 48000)
  .sort((a, b) => a - b);
const TIERS: QualityTierName[] = ['draft', 'standard', 'high'];
const ROUNDS = 5;
const SLICE_MS = 300;

function median(v: number[]): number {
  const s = [...v].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function timeIt(step: () => number): number {
  let n = step();
  n = 0;
  const t0 = performance.now();
  let t = t0;
  while (t - t0 < SLICE_MS) {
    n += step();
    t = performance.now();
  }
  return n / ((t - t0) / 1000);
}

type Cell = { rejectionDb: number; passbandDb: number };

async function quality(log: (s: string) => void): Promise<Record<string, Record<string, Record<string, Cell>>>> {
  const out: Record<string, Record<string, Record<string, Cell>>> = {};
  log('Sweep rejection dB (worst spur in 20 Hz–min(20 kHz, Nyquist)) / passband dB at 0.9·min(20 kHz, Nyquist); test/dsp/sweep-metric.ts');
  for (const fs of RATES) {
    out[fs] = {};
    log(`\n${fs} Hz output`);
    log('row'.padEnd(16) + SPEEDS.map((r) => `r=${r.toFixed(3)}`.padStart(15)).join(''));
    const rows: Record<string, Cell[]> = {};
    for (const r of SPEEDS) {
      const x = sweepInput(fs, r);
      const pb = passbandSine(fs, r);
      for (const tier of TIERS) {
        const cell = { rejectionDb: sweepRejectionDb(resample(x, r, { quality: tier, sampleRate: fs }), fs, r), passbandDb: passbandDb(resample(pb, r, { quality: tier, sampleRate: fs }), fs, r) };
        (rows[tier] ??= []).push(cell);
        (out[fs][tier] ??= {})[r] = cell;
      }
      for (const [name, type] of [['sinc-medium', SINC_MEDIUM], ['sinc-fastest', SINC_FASTEST]] as const) {
        const cell = { rejectionDb: sweepRejectionDb(await libsamplerateResample(x, r, type), fs, r), passbandDb: passbandDb(await libsamplerateResample(pb, r, type), fs, r) };
        (rows[name] ??= []).push(cell);
        (out[fs][name] ??= {})[r] = cell;
      }
    }
    for (const [name, cells] of Object.entries(rows)) log(name.padEnd(16) + cells.map((c) => `${c.rejectionDb.toFixed(0)} / ${c.passbandDb.toFixed(2)}`.padStart(15)).join(''));
  }
  return out;
}

/** resample() on a 10 s buffer, the streaming reader in 128-frame blocks, and sinc fastest, interleaved rounds. */
async function offlineSpeed(log: (s: string) => void): Promise<object> {
  const src = metricMultisine();
  const result: Record<string, object> = {};
  log('\nOffline resample() (whole output array) and resampleChunks() (reused 4096-frame chunk) vs the streaming reader (standard tier, wasm kernel, 48 kHz), ÷ sinc fastest in the same run (median [min–max] of 5 rounds)');
  for (const r of [0.5, 1.7]) {
    const conv = await libsamplerate(SINC_FASTEST, r);
    const dataOut = new Float32Array(8192);
    const len = { frames: 0 };
    const chunk = Math.round(4096 * r);
    let at = 0;
    const fastest = () => {
      if (at + chunk > src.length) at = 0;
      conv.full(src.subarray(at, at + chunk), dataOut, len);
      at += chunk;
      return len.frames;
    };
    const reader = new StreamReader({ table: KernelTable.forTier('standard'), channels: 1 });
    reader.setSource([src], { loop: true });
    const block = [new Float32Array(128)];
    const streaming = () => {
      for (let b = 0; b < 32; b++) reader.read(block, 0, 128, r, r);
      return 32 * 128;
    };
    const part = src.subarray(0, 480000);
    const offline = () => resample(part, r).length;
    const chunked = () => {
      let n = 0;
      for (const c of resampleChunks(part, r)) n += c.length;
      return n;
    };
    const vs: Record<'resample' | 'chunks' | 'streaming', number[]> = { resample: [], chunks: [], streaming: [] };
    for (let round = 0; round < ROUNDS; round++) {
      const f = timeIt(fastest);
      vs.streaming.push(timeIt(streaming) / f);
      vs.resample.push(timeIt(offline) / f);
      vs.chunks.push(timeIt(chunked) / f);
    }
    const fmt = (v: number[]) => `×${median(v).toFixed(2)} [${Math.min(...v).toFixed(2)}–${Math.max(...v).toFixed(2)}]`;
    log(`r=${r}: resample() ${fmt(vs.resample)}   resampleChunks() ${fmt(vs.chunks)}   streaming ${fmt(vs.streaming)}`);
    result[r] = Object.fromEntries(Object.entries(vs).map(([k, v]) => [k, { vsFastest: median(v), range: [Math.min(...v), Math.max(...v)] }]));
  }
  return result;
}

/** Per tier at 44.1 kHz: main-thread design + layout time, layout bytes, and one install slice's time against a render quantum. */
function tableInstall(log: (s: string) => void): object {
  const fs = 44100;
  const quantumMs = (1000 * 128) / fs;
  const result: Record<string, object> = {};
  log(`\nTables off the audio thread (${fs} Hz): main-thread pack time, layout size, audio-thread slice of ${INSTALL_BYTES_PER_QUANTUM / 1024} KB (median / max ms) vs one quantum (${quantumMs.toFixed(2)} ms)`);
  for (const tier of TIERS) {
    const t0 = performance.now();
    const p = packKernelTable(tier, fs, true);
    const packMs = performance.now() - t0;
    const kernel = WasmKernel.create(globalWasmApi())!;
    const table = KernelTable.fromData(p.table);
    const slices: number[] = [];
    for (let done = false; !done; ) {
      const s0 = performance.now();
      done = kernel.installStep(table, p.image!, INSTALL_BYTES_PER_QUANTUM);
      slices.push(performance.now() - s0);
    }
    const row = { packMs, layoutBytes: p.image!.bytes.length, slices: slices.length, sliceMedianMs: median(slices), sliceMaxMs: Math.max(...slices), quantumMs };
    result[tier] = row;
    log(`${tier.padEnd(9)} pack ${packMs.toFixed(0)} ms, layout ${(row.layoutBytes / 1e6).toFixed(1)} MB in ${row.slices} slices, slice ${row.sliceMedianMs.toFixed(3)} / ${row.sliceMaxMs.toFixed(3)} ms`);
  }
  return result;
}

/** Runs the benchmark; prints tables unless `json`; returns the figures. */
export async function run(options: { json: boolean }): Promise<object> {
  const log = options.json ? () => {} : console.log;
  const speed = await offlineSpeed(log);
  const install = tableInstall(log);
  const q = await quality(log);
  const tables = Object.fromEntries(RATES.map((fs) => [fs, Object.fromEntries(TIERS.map((t) => [t, { taps: KernelTable.forTier(t, fs).taps, phases: KernelTable.forTier(t, fs).phases, stretchPerRatio: KernelTable.forTier(t, fs).stretchPerRatio }]))]));
  return { quality: q, speed, install, tables, speeds: SPEEDS };
}
