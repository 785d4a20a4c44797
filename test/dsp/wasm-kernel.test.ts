// The WebAssembly SIMD kernel against the TypeScript reference: same scenes, agreement within 1e-6 per sample.
import { describe, expect, it } from 'vitest';
import { KernelTable, MAX_RATIO, STRETCH_GRID_STEP, StreamReader, activeKernel, qualityTiers, resample, wasmSimdSupported, type KernelName, type QualityTierName } from '../../src/dsp';
import { WasmKernel, globalWasmApi, type WasmApi } from '../../src/dsp/wasm/wasm-kernel';
import { decodeBase64 } from '../../src/dsp/wasm/base64';
import { metricMultisine, seededRandom } from './resampler-metric';

/** Agreement asked of the two kernels, per output sample (the figure). */
const TOLERANCE = 1e-6;

/** A scene signal: a sine pair plus seeded noise, peak about 0.95 (full-scale-like material). */
function material(n: number, seed: number): Float32Array {
  const rand = seededRandom(seed);
  return Float32Array.from({ length: n }, (_, i) => 0.45 * Math.sin(i * 0.031) + 0.3 * Math.sin(i * 1.7 + 0.4) + 0.2 * (rand() * 2 - 1));
}

function maxDiff(a: Float32Array, b: Float32Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) {
    const d = Math.abs(a[i] - b[i]);
    if (!(d <= m)) m = d; // NaN counts as a difference
  }
  return m;
}

function pair(tier: QualityTierName, channels: number): [StreamReader, StreamReader] {
  const make = (kernel: KernelName) => new StreamReader({ table: KernelTable.forTier(tier), channels, kernel });
  return [make('typescript'), make('wasm-simd')];
}

describe('WebAssembly SIMD kernel', () => {
  it('loads in Node (SIMD probe validates, the module instantiates) and is what auto picks', () => {
    expect(wasmSimdSupported()).toBe(true);
    expect(activeKernel()).toBe('wasm-simd');
    expect(new StreamReader({ table: KernelTable.forTier('standard'), channels: 1 }).kernelName).toBe('wasm-simd');
    expect(new StreamReader({ table: KernelTable.forTier('standard'), channels: 1, kernel: 'typescript' }).kernelName).toBe('typescript');
  });

  it('falls back to TypeScript where the platform lacks WebAssembly or SIMD', () => {
    const real = globalWasmApi() as WasmApi;
    const noSimd: WasmApi = { validate: () => false, Module: real.Module, Instance: real.Instance };
    const throwing: WasmApi = { validate: real.validate.bind(real), Module: real.Module, Instance: class { constructor() { throw new RangeError('sync compile refused'); } } as unknown as WasmApi['Instance'] };
    expect(wasmSimdSupported(null)).toBe(false);
    expect(wasmSimdSupported(noSimd)).toBe(false);
    expect(WasmKernel.create(null)).toBeNull();
    expect(WasmKernel.create(noSimd)).toBeNull();
    expect(WasmKernel.create(throwing)).toBeNull();
    expect(WasmKernel.create(real)).not.toBeNull();
  });

  it('decodes base64 as RFC 4648 §10 test vectors give', () => {
    // RFC 4648 §10: "" → "", "f" → "Zg==", "fo" → "Zm8=", "foo" → "Zm9v", "foob" → "Zm9vYg==", "fooba" → "Zm9vYmE=", "foobar" → "Zm9vYmFy".
    const cases: [string, string][] = [['', ''], ['Zg==', 'f'], ['Zm8=', 'fo'], ['Zm9v', 'foo'], ['Zm9vYg==', 'foob'], ['Zm9vYmE=', 'fooba'], ['Zm9vYmFy', 'foobar']];
    for (const [b64, text] of cases) expect(String.fromCharCode(...decodeBase64(b64))).toBe(text);
    expect(() => decodeBase64('Zm9v!')).toThrow(RangeError);
  });

  it('keeps the stretch at or above ratio · stretchPerRatio (so rejection never drops) and within one grid step of it', () => {
    for (const tier of qualityTiers) {
      const t = KernelTable.forTier(tier);
      expect(t.strideGrid.length).toBeLessThanOrEqual(32);
      for (let r = 1; r <= MAX_RATIO; r += 0.00731) {
        const need = r * t.stretchPerRatio;
        const stretch = t.phases / t.strideFor(r);
        if (need <= 1) expect(stretch).toBe(1);
        else {
          expect(stretch).toBeGreaterThanOrEqual(need);
          expect(stretch).toBeLessThanOrEqual(need * STRETCH_GRID_STEP * (1 + 1 / t.strideFor(r)) + 1e-9);
        }
      }
    }
  });

  const ratios = [0.001, 0.25, 0.5, 0.8, 0.999, 1.0001, 1.05, 1.25, 1.7, 2.5, 3.3, 4];
  it.each(qualityTiers.flatMap((tier) => ratios.map((r) => [tier, r] as const)))('agrees with the reference within 1e-6 for resample() at tier %s, ratio %f', (tier, r) => {
    const x = material(Math.max(2000, Math.ceil(3000 * r)), 11);
    const a = resample(x, r, { quality: tier, kernel: 'typescript' });
    const b = resample(x, r, { quality: tier, kernel: 'wasm-simd' });
    expect(b.length).toBe(a.length);
    expect(maxDiff(a, b)).toBeLessThanOrEqual(TOLERANCE);
  });

  it.each(qualityTiers)('agrees on glides across (0, 4] through per-sample ratios, with the same clamps (%s)', (tier) => {
    const x = material(60000, 12);
    const n = 16000;
    const glide = Float32Array.from({ length: n }, (_, i) => 0.02 + 3.98 * (0.5 - 0.5 * Math.cos((2 * Math.PI * i) / n)));
    glide[100] = NaN;
    glide[200] = 9;
    glide[300] = -1;
    const [ts, wa] = pair(tier, 1);
    const outs = [new Float32Array(n), new Float32Array(n)];
    for (const [k, rd] of [ts, wa].entries()) {
      rd.setSource([x], { startFrame: 3.25 });
      for (let o = 0; o < n; o += 700) rd.readRatios([outs[k]], o, Math.min(700, n - o), glide, o);
    }
    expect(maxDiff(outs[0], outs[1])).toBeLessThanOrEqual(TOLERANCE);
    expect(wa.position).toBe(ts.position);
    expect(wa.clampCount).toBe(ts.clampCount);
    expect(wa.clampCount).toBe(3);
  });

  it('sanitises per-sample ratios as the reference does, bit for bit, wherever the ratios lie', () => {
    // Float32 edge values: NaN, ±Infinity, −0, 0, the smallest subnormal, MIN_RATIO (2^−16) and the float below it,
    // MAX_RATIO (4) and the float above it, huge and negative ratios; the rest a glide with loop wraps.
    const hostile = [NaN, 0.7, -0, 0, 2 ** -149, 2 ** -16, 2 ** -16 * (1 - 2 ** -24), Infinity, 4, 4 * (1 + 2 ** -22), -Infinity, NaN, 1e30, -3, 1.3];
    const n = 1500;
    const glide = Float32Array.from({ length: n }, (_, i) => (i % 37 < hostile.length ? hostile[i % 37] : 0.3 + 2.5 * Math.abs(Math.sin(i * 0.013))));
    const x = [material(12000, 13), material(12000, 14)];
    const k = WasmKernel.shared() as WasmKernel;
    const [ts, wa] = pair('standard', 2);
    // In module memory (read in place), placed after the readers' table so that no growth detaches the view.
    const at = k.allocFloats(n + 8);
    const inModule = new Float32Array(k.f32.buffer, at + 32, n);
    inModule.set(glide);
    const block = new Float32Array(128);
    const outs = [x.map(() => new Float32Array(700)), x.map(() => new Float32Array(700))];
    for (const rd of [ts, wa]) rd.setSource(x, { loop: true, loopStart: 1000, loopEnd: 9000, startFrame: 2.5 });
    const rand = seededRandom(9);
    for (let o = 0, b = 0; o < n; b++) {
      const m = Math.min(n - o, b % 3 === 0 ? 128 : 1 + Math.floor(rand() * 699));
      for (const [j, rd] of [ts, wa].entries()) {
        if (b % 3 === 0) {
          // A JavaScript array that fits the module's scratch (copied whole), after a ramp whose NaN keeps the last ratio.
          rd.read(outs[j], 0, 16, NaN, 0.9);
          block.set(glide.subarray(o, o + m));
          rd.readRatios(outs[j], 0, m, block, 0);
        } else rd.readRatios(outs[j], 0, m, b % 3 === 1 ? glide : inModule, o);
      }
      expect(wa.position).toBe(ts.position);
      expect(wa.clampCount).toBe(ts.clampCount);
      for (let c = 0; c < 2; c++) expect(maxDiff(outs[0][c].subarray(0, m), outs[1][c].subarray(0, m))).toBeLessThanOrEqual(TOLERANCE);
      o += m;
    }
    expect(ts.clampCount).toBeGreaterThan(400);
    k.release(at, 4 * (n + 8));
  });

  it('writes the same samples into views of module memory as into arrays, also after the memory grew', () => {
    const k = WasmKernel.shared() as WasmKernel;
    const x = [material(30000, 15), material(30000, 16)];
    const glide = Float32Array.from({ length: 128 }, (_, i) => 0.5 + 0.3 * Math.sin(i * 0.05));
    const [, plain] = pair('standard', 2);
    const [, placed] = pair('standard', 2);
    for (const rd of [plain, placed]) rd.setSource(x, { startFrame: 1.5 });
    const want = [new Float32Array(128), new Float32Array(128)];
    const spare: number[] = [];
    const first = k.f32;
    for (let b = 0; b < 12; b++) {
      // Twice the memory grows first (a request of half its size: the old views detach); outputs alternate between
      // memory and arrays.
      if (b === 4 || b === 9) {
        const n = k.f32.length >> 1;
        spare.push(k.allocFloats(n), n);
      }
      const at = k.allocFloats(256);
      const got = b % 2 === 0 ? [new Float32Array(k.f32.buffer, at, 128), new Float32Array(k.f32.buffer, at + 512, 128)] : [new Float32Array(128), new Float32Array(128)];
      plain.readRatios(want, 0, 128, glide, 0);
      placed.readRatios(got, 0, 128, glide, 0);
      expect(got[0]).toEqual(want[0]);
      expect(got[1]).toEqual(want[1]);
      k.release(at, 1024);
    }
    expect(k.f32 === first).toBe(false);
    for (let j = 0; j < spare.length; j += 2) k.release(spare[j], 4 * spare[j + 1]);
  });

  // Engine-like scenes: 128-frame blocks with per-block ramps, loops (one shorter than the kernel window), one-shot ends.
  const scenes: { name: string; channels: number; loop?: { start: number; end: number }; start: number; length: number }[] = [
    { name: 'mono one-shot past its end', channels: 1, start: 0.5, length: 9000 },
    { name: 'stereo loop', channels: 2, loop: { start: 700, end: 5100 }, start: 11.75, length: 6000 },
    { name: 'three-channel loop', channels: 3, loop: { start: 0, end: 3000 }, start: 0, length: 3000 },
    { name: 'stereo loop shorter than the window', channels: 2, loop: { start: 1000, end: 1031 }, start: 990.5, length: 3000 },
  ];
  it.each(qualityTiers.flatMap((tier) => scenes.map((s) => [tier, s.name, s] as const)))('agrees block by block on gliding ratios (%s, %s)', (tier, _name, scene) => {
    const src = Array.from({ length: scene.channels }, (_, c) => material(scene.length, 20 + c));
    const readers = pair(tier, scene.channels);
    for (const rd of readers) rd.setSource(src, { loop: scene.loop !== undefined, loopStart: scene.loop?.start, loopEnd: scene.loop?.end, startFrame: scene.start });
    const outs = readers.map(() => src.map(() => new Float32Array(128)));
    let r0 = 0.3;
    let worst = 0;
    for (let b = 0; b < 160; b++) {
      const r1 = b % 40 === 7 ? 1 : 0.05 + 3.95 * Math.abs(Math.sin(b * 0.11));
      readers.forEach((rd, k) => rd.read(outs[k], 0, 128, r0, r1));
      for (let c = 0; c < scene.channels; c++) worst = Math.max(worst, maxDiff(outs[0][c], outs[1][c]));
      expect(readers[1].position).toBe(readers[0].position);
      expect(readers[1].finished).toBe(readers[0].finished);
      r0 = r1;
    }
    expect(worst).toBeLessThanOrEqual(TOLERANCE);
  });

  it('gives identical output whatever the block split (runs and spans are invisible)', () => {
    const x = metricMultisine().subarray(0, 40000);
    const n = 9000;
    const glide = Float32Array.from({ length: n }, (_, i) => 0.4 + 3 * (i / n));
    const whole = new Float32Array(n);
    const parts = new Float32Array(n);
    const a = new StreamReader({ table: KernelTable.forTier('standard'), channels: 1, kernel: 'wasm-simd' });
    a.setSource([x]);
    a.readRatios([whole], 0, n, glide, 0);
    const b = new StreamReader({ table: KernelTable.forTier('standard'), channels: 1, kernel: 'wasm-simd' });
    b.setSource([x]);
    const rand = seededRandom(5);
    for (let o = 0; o < n; ) {
      const k = Math.min(n - o, 1 + Math.floor(rand() * 900));
      b.readRatios([parts], o, k, glide, o);
      o += k;
    }
    expect(parts).toEqual(whole);
  });
});
