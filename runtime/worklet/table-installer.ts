// Kernel tables designed on the main thread, received by the audio thread: rebuilt from their samples without design
// work, and their WebAssembly layouts copied into the kernel's memory a bounded slice per render quantum.
import { INSTALL_BYTES_PER_QUANTUM, KernelTable, WasmKernel, isPackedKernelTable, type KernelImage, type PackedKernelTable } from '../../src/dsp/index';

/** Counters of table work on the audio thread (reported with the stats). */
export interface TableCounters {
  /** Kernel tables designed in this realm (Kaiser sums; 0 when every table came from the main thread). */
  designed: number;
  /** WebAssembly stride layouts built in this realm (0 when every layout came from the main thread). */
  stridesBuilt: number;
  /** Layouts still being copied in (one slice per render quantum). */
  installing: number;
}

/** Receives packed tables; `step` installs one slice of the oldest pending layout. */
export class TableInstaller {
  private readonly kernel: WasmKernel | null;
  private readonly pending: { table: KernelTable; image: KernelImage }[] = [];
  /** Tables whose layouts this installer placed in the kernel's memory (dropped again by `dispose`). */
  private readonly placed: KernelTable[] = [];

  /** `kernel`: the engine's WebAssembly kernel, or null when it runs the TypeScript kernel (tables are then ready at once). */
  constructor(kernel: WasmKernel | null) {
    this.kernel = kernel;
  }

  /**
   * Rebuilds `packed` tables (throws TypeError on a malformed entry); returns those ready for the engine now. On the
   * TypeScript kernel every table is ready; on the WebAssembly kernel only one with its layout, at once when `installNow`
   * (construction, before any audio), else after `step` calls; one without a layout is left out (its tier waits for a
   * later message that brings one), so that the audio thread never builds a layout.
   */
  receive(packed: readonly unknown[], installNow: boolean): KernelTable[] {
    const ready: KernelTable[] = [];
    for (const p of packed) {
      if (!isPackedKernelTable(p)) throw new TypeError('tables: expected { table: { name, design, aliasStop, taps, dense, phaseMajor }, image }');
      const table = KernelTable.fromData(p.table);
      const image = (p as PackedKernelTable).image;
      if (this.kernel === null) {
        ready.push(table);
      } else if (image === null || image === undefined) {
        continue;
      } else if (installNow) {
        this.kernel.installStep(table, image, Infinity);
        this.placed.push(table);
        ready.push(table);
      } else {
        this.pending.push({ table, image });
        this.placed.push(table);
      }
    }
    return ready;
  }

  /** Copies one slice (INSTALL_BYTES_PER_QUANTUM) of the oldest pending layout; returns its table once complete, else null. */
  step(): KernelTable | null {
    const job = this.pending[0];
    if (job === undefined || this.kernel === null) return null;
    if (!this.kernel.installStep(job.table, job.image, INSTALL_BYTES_PER_QUANTUM)) return null;
    this.pending.shift();
    return job.table;
  }

  /** Hands every layout this installer placed (or was placing) back to the kernel; the engine using them must be disposed. */
  dispose(): void {
    if (this.kernel !== null) for (const t of this.placed) this.kernel.dropTable(t);
    this.placed.length = 0;
    this.pending.length = 0;
  }

  /** Layouts still pending. */
  get installing(): number {
    return this.pending.length;
  }

  /** The counters now. */
  counters(): TableCounters {
    return { designed: KernelTable.designCount, stridesBuilt: this.kernel?.stridesBuilt ?? 0, installing: this.pending.length };
  }
}
