// The resampler tiers the worklet has kernel tables for, and the tables a tier switch sends first: designed here, on
// the main thread, so that the audio thread never designs one (it copies the layout in slices and switches once in).
import { packKernelTable, wasmSimdSupported, type QualityTierName } from '../src/dsp/index';
import type { TablesCommand } from './protocol';

/** Tiers with tables in the worklet; null when the processor designs its own (built without tables). */
export class TableTiers {
  private readonly tiers: Set<string> | null;

  /** `tiers`: those the processor was built with (absent: it designs its own); `sampleRate`: the context's, Hz. */
  constructor(
    tiers: readonly string[] | undefined,
    private readonly sampleRate: number,
  ) {
    this.tiers = tiers === undefined ? null : new Set(tiers);
  }

  /** The command carrying `tier`'s table when the worklet lacks it (then counted as sent), else null. */
  tablesFor(tier: QualityTierName): TablesCommand | null {
    if (this.tiers === null || this.tiers.has(tier)) return null;
    this.tiers.add(tier);
    return { type: 'tables', tables: [packKernelTable(tier, this.sampleRate, wasmSimdSupported())] };
  }
}
