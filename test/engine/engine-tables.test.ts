// Kernel tables from the host: an engine given tables designed elsewhere does no table design and builds no
// WebAssembly layout on its own thread, also when the tier changes; installed layouts render as built ones do.
import { describe, expect, it } from 'vitest';
import { Engine } from '../../src/engine';
import { KernelTable, StreamReader, WasmKernel, packKernelTable, type PackedKernelTable } from '../../src/dsp';
import { renderFor, sine, tuningWith } from './engine-helpers';
import { sweepInput, sweepRejectionDb } from '../dsp/sweep-metric';

const RATE = 44100;
const packedCache = new Map<string, PackedKernelTable>();
/** Each tier packed once per file (the main thread's work). */
function packed(name: 'draft' | 'standard' | 'high'): PackedKernelTable {
  let p = packedCache.get(name);
  if (!p) packedCache.set(name, (p = packKernelTable(name, RATE, true)));
  return p;
}

/** What another thread would receive: the table rebuilt from its samples, its layout installed in this realm's kernel. */
function receive(p: PackedKernelTable, sliceBytes = Infinity): { table: KernelTable; slices: number } {
  const table = KernelTable.fromData(p.table);
  let slices = 1;
  if (p.image !== null) while (!WasmKernel.shared()!.installStep(table, p.image, sliceBytes)) slices++;
  return { table, slices };
}

const tier = (name: 'draft' | 'standard' | 'high') => tuningWith((t) => (t.resampler.tier = name));

describe('engine tables from the host', () => {
  it('designs no table and builds no WebAssembly layout when given tables, across tier switches', () => {
    const given = (['draft', 'standard', 'high'] as const).map((t) => receive(packed(t)).table);
    const kernel = WasmKernel.shared()!;
    const designed = KernelTable.designCount;
    const built = kernel.stridesBuilt;
    const e = new Engine({ sampleRate: RATE, capacity: 4, tuning: tier('standard'), tables: given });
    e.play(e.addSound([sine(440, RATE, 1)], RATE), { ratio: 1.7, loop: true });
    const out = [new Float32Array(128), new Float32Array(128)];
    for (const name of ['high', 'draft', 'standard'] as const) {
      e.setTuning(tier(name));
      for (let b = 0; b < 20; b++) e.render(out, 128);
      expect(e.stats.tier).toBe(name);
    }
    expect(e.stats.kernel).toBe('wasm-simd');
    expect(KernelTable.designCount).toBe(designed);
    expect(kernel.stridesBuilt).toBe(built);
  });

  it('keeps the table in use while the tuning asks for a tier it was not given, and switches when useTables brings it', () => {
    const standard = receive(packed('standard')).table;
    const e = new Engine({ sampleRate: RATE, capacity: 2, tuning: tier('standard'), tables: [standard] });
    e.setTuning(tier('high'));
    expect(e.stats.tier).toBe('standard');
    e.useTables([receive(packed('high')).table]);
    expect(e.stats.tier).toBe('high');
  });

  it('renders through a layout installed in 64 KB slices exactly as through one built in place', () => {
    const p = packed('standard');
    const bytes = p.image!.bytes.length;
    const { table, slices } = receive(p, 65536);
    expect(slices).toBe(Math.ceil(bytes / 65536));
    const built = KernelTable.forTier('standard', RATE);
    const x = sine(3000, RATE, 0.5);
    for (const r of [0.6, 1.7, 3.3]) {
      const outs = [built, table].map((t) => {
        const reader = new StreamReader({ table: t, channels: 1, kernel: 'wasm-simd' });
        reader.setSource([x]);
        const y = new Float32Array(2000);
        reader.read([y], 0, y.length, r, r);
        return y;
      });
      expect(outs[1]).toEqual(outs[0]);
    }
  });

  it('is band-limited at 44.1 kHz output in the engine too: a sweep sped up 2.5× keeps spurs ≥ 100 dB down (was −21 dB)', () => {
    // The engine designs its tables for its own rate; same sweep measure as test/dsp/resampler-rates.test.ts.
    const fs = 44100;
    const r = 2.5;
    const e = new Engine({ sampleRate: fs, capacity: 2 });
    e.play(e.addSound([sweepInput(fs, r)], fs), { group: 'interface', ratio: r, fadeInSeconds: 0 });
    expect(sweepRejectionDb(renderFor(e, 2)[0], fs, r)).toBeGreaterThanOrEqual(100);
  });

  it('refuses tables designed for another output rate (they would fold into the audible band there)', () => {
    expect(() => new Engine({ sampleRate: 44100, tables: [KernelTable.forTier('standard', 48000)] })).toThrow(/48000|44100 Hz/);
    expect(() => new Engine({ sampleRate: 48000, tables: [KernelTable.forTier('standard', 48000)] })).not.toThrow();
  });
});
