// The stats report of the worklet host: the engine's counters with the host's own errors and the peaks of the whole
// report interval, and the playing voices' monitors under their main-thread handles.
import type { Engine } from '../../src/engine/index';
import type { EngineStats, VoiceMonitor } from '../../src/index';
import type { HandleBook } from './handle-book';

/** Voice monitors sent per stats report at most. */
const MAX_MONITORS = 64;

/** Monitor rows (one per voice slot, filled in place) and the interval's peaks, turned into a report's fields. */
export class HostStats {
  private readonly monitors: VoiceMonitor[] = [];
  /** Largest peakIn / peakOut of every render since the last report (the engine resets its own per call). */
  private intervalPeakIn = 0;
  private intervalPeakOut = 0;

  /** Rows for `engine`'s `capacity` voices; handles come from `handles`. */
  constructor(
    private readonly engine: Engine,
    private readonly handles: HandleBook,
    capacity: number,
  ) {
    for (let i = 0; i < capacity; i++) this.monitors.push(emptyMonitor());
  }

  /** Keeps the largest peaks of the render just done. */
  notePeaks(): void {
    const st = this.engine.stats;
    if (st.peakIn > this.intervalPeakIn) this.intervalPeakIn = st.peakIn;
    if (st.peakOut > this.intervalPeakOut) this.intervalPeakOut = st.peakOut;
  }

  /** Up to 64 monitors of the playing voices, each under its main-thread handle (−1 if unknown). */
  voices(): VoiceMonitor[] {
    const count = this.engine.monitor(this.monitors);
    const voices: VoiceMonitor[] = [];
    for (let i = 0; i < count && voices.length < MAX_MONITORS; i++) {
      const m = this.monitors[i];
      voices.push({ ...m, voice: this.handles.ownerOf(m.voice) ?? -1 });
    }
    return voices;
  }

  /**
   * The engine's counters with `hostErrors` added and the peaks over the whole interval (true peak of every sample since
   * the last report), then starts a new interval; the last shockwave's time goes out in context time (`timeOffset` + engine time).
   */
  take(hostErrors: number, timeOffset: number): EngineStats {
    const st = this.engine.stats;
    const stats: EngineStats = {
      ...st, errors: st.errors + hostErrors, lastShockwaveTime: timeOffset + st.lastShockwaveTime, peakIn: this.intervalPeakIn, peakOut: this.intervalPeakOut,
    };
    this.intervalPeakIn = 0;
    this.intervalPeakOut = 0;
    return stats;
  }
}

function emptyMonitor(): VoiceMonitor {
  return { voice: -1, sourceId: -1, group: '', ratioCents: 0, dopplerCents: 0, radialSpeed: 0, distance: 0, cutoffHz: 0, gainDb: 0, virtual: false };
}
