// WebAssembly kernel memory: module bytes per engine and engine start-up with one shared instance (explicit ownership,
// the shipped design) against one instance per engine, measured in the same run; and the heap growth per block of a
// busy scene on both kernels (docs/memory.md).
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { Engine } from '../src/engine';
import { KernelTable, WasmKernel } from '../src/dsp';
import type { EngineSnapshot, KernelPreference } from '../src/index';

const SR = 48000;
const ROUNDS = 7;

function spread(xs: number[]): { median: number; min: number; max: number } {
  const s = [...xs].sort((a, b) => a - b);
  return { median: s[s.length >> 1], min: s[0], max: s[s.length - 1] };
}

/** A fresh module instance, through the same global API the shared one uses. */
function freshKernel(): WasmKernel {
  const api = (globalThis as { WebAssembly?: unknown }).WebAssembly as Parameters<typeof WasmKernel.create>[0];
  return WasmKernel.create(api)!;
}

/** 64 stereo looping voices on 8 sources moving on circles (default tuning): heap growth per block over 5,000 blocks after 3,000. */
function bytesPerBlock(kernel: KernelPreference, gc: () => void): number {
  const e = new Engine({ sampleRate: SR, kernel });
  const n = 2 * SR;
  const a = new Float32Array(n);
  const b = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    a[i] = 0.3 * Math.sin(i * 0.031);
    b[i] = 0.3 * Math.sin(i * 0.047);
  }
  const s = e.addSound([a, b], SR);
  for (let i = 0; i < 64; i++) e.play(s, { loop: true, gain: 0.05, sourceId: i % 8 });
  const snap: EngineSnapshot = {
    time: 0,
    listener: { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } },
    sources: Array.from({ length: 8 }, (_, id) => ({ id, position: { x: 0, y: 0, z: -5 } })),
  };
  const l = new Float32Array(128);
  const r = new Float32Array(128);
  let k = 0;
  const blocks = (m: number) => {
    for (let i = 0; i < m; i++, k++) {
      if (k % 6 === 0) {
        snap.time = e.time;
        for (const src of snap.sources) src.position.x = 20 * Math.sin(k * 0.01 + src.id);
        e.pushSnapshot(snap);
      }
      e.render([l, r], 128);
    }
  };
  blocks(3000);
  gc();
  const before = process.memoryUsage().heapUsed;
  blocks(5000);
  const after = process.memoryUsage().heapUsed;
  e.dispose();
  return (after - before) / 5000;
}

export async function run(options: { json: boolean }): Promise<object> {
  const shared = WasmKernel.shared();
  if (shared === null) {
    if (!options.json) console.log('WebAssembly SIMD is not available here: nothing to measure');
    return { skipped: true };
  }
  const table = KernelTable.forTier('standard', SR);
  new Engine({ sampleRate: SR }).dispose(); // shared tables placed, code warm
  const image = shared.imageOf(table);
  const perEngine: number[] = [];
  const startShared: number[] = [];
  const startOwn: number[] = [];
  let ownMemory = 0;
  for (let i = 0; i < ROUNDS; i++) {
    const before = shared.bytesInUse;
    let t0 = performance.now();
    const e = new Engine({ sampleRate: SR });
    startShared.push(performance.now() - t0);
    perEngine.push(shared.bytesInUse - before);
    e.dispose();
    // The other design: a new instance per engine, its tables copied in from an image (the cheapest way to get them).
    t0 = performance.now();
    const own = freshKernel();
    own.installStep(table, image, Infinity);
    startOwn.push(performance.now() - t0);
    ownMemory = own.exports.memory.buffer.byteLength;
  }
  setFlagsFromString('--expose-gc');
  const gc = runInNewContext('gc') as () => void;
  const result = {
    sharedBytesPerEngine: spread(perEngine).median,
    ownInstanceBytesPerEngine: ownMemory,
    standardLayoutBytes: image.bytes.length,
    engineStartMs: spread(startShared),
    ownInstanceExtraMs: spread(startOwn),
    ownInstanceStartRatio: (spread(startShared).median + spread(startOwn).median) / spread(startShared).median,
    heapBytesPerBlock: { wasm: bytesPerBlock('auto', gc), typescript: bytesPerBlock('typescript', gc) },
  };
  if (!options.json) {
    console.log('| design | module bytes per engine | start-up ms (median, min–max of 7) |');
    console.log('| --- | --- | --- |');
    const s = result.engineStartMs;
    const o = result.ownInstanceExtraMs;
    console.log(`| one shared instance (shipped) | ${result.sharedBytesPerEngine} | ${s.median.toFixed(1)} (${s.min.toFixed(1)}–${s.max.toFixed(1)}) |`);
    console.log(`| one instance per engine | ${ownMemory} | + ${o.median.toFixed(1)} (${o.min.toFixed(1)}–${o.max.toFixed(1)}): ×${result.ownInstanceStartRatio.toFixed(2)} |`);
    console.log(`\nheap growth per block, 64 stereo voices on 8 moving sources (after 3,000 blocks and a gc): wasm ${result.heapBytesPerBlock.wasm.toFixed(0)} B, typescript ${result.heapBytesPerBlock.typescript.toFixed(0)} B`);
  }
  return result;
}
