// The kernel module's memory allocator: regions given back are merged and reused, a table's region goes back whole,
// and holders of views are told once per growth (never polled).
import { describe, expect, it } from 'vitest';
import { KernelTable } from '../../src/dsp';
import { WasmKernel, globalWasmApi } from '../../src/dsp/wasm/wasm-kernel';

const fresh = (): WasmKernel | null => WasmKernel.create(globalWasmApi());
const hasSimd = fresh() !== null;

describe.runIf(hasSimd)('WasmKernel memory', () => {
  it('merges released neighbours, so that their whole span is reused by one larger request', () => {
    const k = fresh()!;
    const base = k.bytesInUse;
    const a = k.allocFloats(1000);
    const b = k.allocFloats(2000);
    const c = k.allocFloats(3000);
    const keep = k.allocFloats(16); // above c: the top stays put, the three blocks must merge among themselves
    k.release(b, 8000);
    k.release(a, 4000);
    k.release(c, 12000);
    expect(k.bytesInUse).toBe(base + 64);
    expect(k.allocFloats(6000)).toBe(a);
    k.release(keep, 64);
  });

  it('lowers its top when the last region goes back, so memory does not creep over cycles', () => {
    const k = fresh()!;
    const base = k.bytesInUse;
    const first = k.allocFloats(50_000);
    k.release(first, 200_000);
    for (let i = 0; i < 20; i++) {
      const at = k.allocFloats(50_000 + 1000 * (i % 3));
      expect(at).toBe(first);
      k.release(at, 4 * (50_000 + 1000 * (i % 3)));
    }
    expect(k.bytesInUse).toBe(base);
  });

  it("hands a placed table's region back whole, and places the table there again", () => {
    const k = fresh()!;
    const table = KernelTable.forTier('draft', 48000);
    const base = k.bytesInUse;
    const header = k.tablePointer(table);
    const image = k.imageOf(table);
    expect(k.bytesInUse - base).toBeGreaterThanOrEqual(image.bytes.length);
    const spans = k.bytesInUse - base - image.bytes.length; // the shared source spans, kept by the instance
    k.dropTable(table);
    expect(k.hasTable(table)).toBe(false);
    expect(k.bytesInUse - base).toBe(spans);
    expect(k.tablePointer(table)).toBe(header);
  });

  it('gives back the region of an install dropped before it finished', () => {
    const k = fresh()!;
    const table = KernelTable.forTier('draft', 48000);
    const image = fresh()!.imageOf(table);
    const base = k.bytesInUse;
    expect(k.installStep(table, image, 64 * 1024)).toBe(false);
    k.dropTable(table);
    expect(k.bytesInUse).toBe(base);
    expect(k.installStep(table, image, Infinity)).toBe(true);
    expect(k.hasTable(table)).toBe(true);
  });

  it('tells each watcher once per growth and never for allocations that fit', () => {
    const k = fresh()!;
    let told = 0;
    const w = { memoryGrew: () => told++ };
    k.watch(w);
    k.watch(w); // once only
    const room = k.exports.memory.buffer.byteLength - k.bytesInUse;
    k.allocFloats(16);
    expect(told).toBe(0);
    const before = k.exports.memory.buffer;
    k.allocFloats(room); // more than what is left: memory grows
    expect(k.exports.memory.buffer).not.toBe(before);
    expect(told).toBe(1);
    expect(k.f32.buffer).toBe(k.exports.memory.buffer);
    k.unwatch(w);
    k.allocFloats(4 * k.exports.memory.buffer.byteLength);
    expect(told).toBe(1);
  });
});
