// Kernel tables designed on one thread and used on another: the Kaiser-windowed sinc samples (J. O. Smith, "Digital
// Audio Resampling", CCRMA) and the WebAssembly kernel's per-stride layout, packed as transferable arrays.
import { KernelTable, type KernelTableData } from './kernel-table';
import { qualityTiers, type QualityTierName } from './quality-tiers';
import { WasmKernel, globalWasmApi, wasmSimdSupported, type KernelImage } from './wasm/wasm-kernel';

/** One tier's table for another thread: its samples and, when asked for, the WebAssembly kernel's layout of it. */
export interface PackedKernelTable {
  /** The table's samples and design (`KernelTable.toData`, arrays copied). */
  readonly table: KernelTableData;
  /** The WebAssembly kernel's per-stride layout (`WasmKernel.imageOf`), or null (none asked for, or no SIMD here). */
  readonly image: KernelImage | null;
}

/** Bytes of an image copied per render quantum on the audio thread while a tier's layout is being installed. */
export const INSTALL_BYTES_PER_QUANTUM = 128 * 1024;

/**
 * Designs `tier`'s table for output rate `sampleRate` (Hz) here (main thread; allocates, may take ~0.1 s for 'high')
 * and packs it; `withImage` also lays it out for the WebAssembly kernel, in a throwaway instance of the module.
 */
export function packKernelTable(tier: QualityTierName, sampleRate: number, withImage: boolean): PackedKernelTable {
  const t = KernelTable.forTier(tier, sampleRate);
  const d = t.toData();
  const table: KernelTableData = { ...d, dense: d.dense.slice(), phaseMajor: d.phaseMajor.slice() };
  let image: KernelImage | null = null;
  if (withImage && wasmSimdSupported()) image = WasmKernel.create(globalWasmApi())?.imageOf(t) ?? null;
  return { table, image };
}

/** Every tier packed for `sampleRate`, with the WebAssembly layout of `imageTier` only (the others follow on demand). */
export function packAllTiers(sampleRate: number, imageTier: QualityTierName | null): PackedKernelTable[] {
  return qualityTiers.map((tier) => packKernelTable(tier, sampleRate, tier === imageTier));
}

/** The buffers a postMessage can transfer instead of copying. */
export function packedTransfer(packed: readonly PackedKernelTable[]): ArrayBuffer[] {
  const out: ArrayBuffer[] = [];
  for (const p of packed) {
    out.push(p.table.dense.buffer as ArrayBuffer, p.table.phaseMajor.buffer as ArrayBuffer);
    if (p.image !== null) out.push(p.image.bytes.buffer as ArrayBuffer);
  }
  return out;
}

/** True when `value` has the shape of a PackedKernelTable (arrays of the right types; lengths are checked by `KernelTable.fromData`). */
export function isPackedKernelTable(value: unknown): value is PackedKernelTable {
  if (typeof value !== 'object' || value === null) return false;
  const v = value as { table?: Partial<KernelTableData>; image?: Partial<KernelImage> | null };
  const t = v.table;
  if (typeof t !== 'object' || t === null || !(t.dense instanceof Float32Array) || !(t.phaseMajor instanceof Float32Array)) return false;
  if (typeof t.name !== 'string' || typeof t.taps !== 'number' || typeof t.aliasStop !== 'number' || typeof t.design !== 'object' || t.design === null) return false;
  const im = v.image;
  return im === null || im === undefined || (im.bytes instanceof Uint8Array && typeof im.origin === 'number');
}
