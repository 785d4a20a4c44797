// Carries the engine's voice events to the main thread: drains the engine's ring into preallocated scratch, maps
// engine handles to main-thread handles, and posts only when there is something to say (no allocation otherwise).
import { EVENT_ENDED, type Engine } from '../../src/engine/index';
import type { Seconds } from '../../src/index';
import type { ControlCommand, VoiceEventsReport } from '../control-commands';
import type { HandleBook } from './handle-book';

/** Events drained per post at most (the ring holds more; the rest go with the next block). */
const EVENTS_PER_POST = 256;

/** Drains voice events after each render and posts them with the voices' positions. */
export class VoiceEventRelay {
  private readonly scratch = new Float64Array(3 * EVENTS_PER_POST);
  private readonly refused: number[] = [];
  /** engine.events.dropped already seen: when it moves, 'ended' events may have been lost and the book is swept. */
  private dropped = 0;
  private readonly hasEnded = (engineVoice: number): boolean => this.engine.voiceState(engineVoice) === 'ended';

  constructor(
    private readonly engine: Engine,
    private readonly book: HandleBook,
    private readonly post: (r: VoiceEventsReport) => void,
  ) {}

  /** Notes a play the engine refused: the main thread hears 'ended' for it with the next post. */
  refuse(mainVoice: number): void {
    this.refused.push(mainVoice);
  }

  /** Applies a control command to the engine (main-thread voice handles mapped through the book). */
  apply(c: ControlCommand): void {
    const e = this.engine;
    switch (c.type) {
      case 'pause':
        e.pause(c.group);
        return;
      case 'resume':
        e.resume(c.group);
        return;
      case 'group':
        if (c.volumeDb !== undefined) e.setGroupVolume(c.group, c.volumeDb);
        if (c.muted !== undefined) e.setGroupMute(c.group, c.muted);
        if (c.solo !== undefined) e.setGroupSolo(c.group, c.solo);
        if (c.pausable !== undefined) e.setGroupPausable(c.group, c.pausable);
        return;
      case 'seek': {
        const v = this.book.voiceOf(c.voice);
        if (v !== undefined) e.seek(v, c.seconds);
        return;
      }
      case 'source-spatial':
        e.setSourceSpatial(c.source, c.spatial);
        return;
    }
  }

  /** Posts waiting events (and positions) when there are any, or always when `force` (stats and sync); `contextTime` is now. */
  flush(contextTime: Seconds, force = false): void {
    if (this.engine.events.length === 0 && this.refused.length === 0 && !force) return;
    const list: number[] = [];
    for (const v of this.refused) list.push(v, EVENT_ENDED, contextTime);
    this.refused.length = 0;
    const offset = contextTime - this.engine.time;
    for (;;) {
      const n = this.engine.drainEvents(this.scratch);
      for (let k = 0; k < n; k++) {
        const code = this.scratch[3 * k];
        const handle = this.scratch[3 * k + 1];
        // A voice's handles end with its 'ended' event: the book forgets them here.
        const main = code === EVENT_ENDED ? this.book.endVoice(handle) : this.book.ownerOf(handle);
        if (main === undefined) continue;
        list.push(main, code, this.scratch[3 * k + 2] + offset);
      }
      if (n < EVENTS_PER_POST) break;
    }
    if (this.engine.events.dropped !== this.dropped) {
      // The ring overflowed: some 'ended' events never came; ask the engine which mapped voices are gone.
      this.dropped = this.engine.events.dropped;
      this.book.sweep(this.hasEnded, (main) => list.push(main, EVENT_ENDED, contextTime));
    }
    const voices = this.book.mappedVoices;
    const positions = new Float64Array(3 * voices.size);
    let i = 0;
    for (const [main, v] of voices) {
      positions[i++] = main;
      positions[i++] = this.engine.voicePosition(v);
      positions[i++] = this.engine.voiceSpeed(v);
    }
    this.post({ type: 'voice-events', events: Float64Array.from(list), positions, contextTime });
  }
}
