// The runtime's live voices on the main thread: their handles, the sources they follow (so that update() can send
// voiced sources first), and the delivery of the worklet's voice events and positions in order.
import { voiceEventName } from '../src/engine/index';
import type { Seconds } from '../src/index';
import type { VoiceEventsReport } from './control-commands';
import type { RalentiSource } from './ralenti-source';
import { VoiceHandle, type RalentiVoiceEvent, type VoiceHandleHost } from './ralenti-voice';

/** Live voice handles of one runtime and the sources with voices. */
export class VoiceRegistry {
  /** Sources followed by at least one voice that has not ended. */
  readonly voiced = new Set<RalentiSource>();
  private readonly handles = new Map<number, { handle: VoiceHandle; source: RalentiSource | null }>();
  private readonly listeners = new Set<(e: RalentiVoiceEvent) => void>();

  constructor(private readonly host: VoiceHandleHost) {}

  /** A handle for a voice just sent to the worklet (loop region and offset in seconds; null loop = one-shot). */
  add(id: number, duration: Seconds, loop: { start: Seconds; end: Seconds } | null, offset: Seconds, source: RalentiSource | null): VoiceHandle {
    const handle = new VoiceHandle(id, this.host, duration, loop, offset);
    this.handles.set(id, { handle, source });
    if (source) {
      source.voiceCount++;
      this.voiced.add(source);
    }
    return handle;
  }

  /** Calls `cb` for every voice event, in order; returns an unsubscribe function. */
  listen(cb: (e: RalentiVoiceEvent) => void): () => void {
    this.listeners.add(cb);
    return () => this.listeners.delete(cb);
  }

  /** Delivers a batch of events in order (voice listeners, then runtime listeners), then takes the reported positions. */
  receive(r: VoiceEventsReport): void {
    const ev = r.events;
    for (let k = 0; k + 2 < ev.length; k += 3) {
      const entry = this.handles.get(ev[k]);
      if (!entry) continue;
      const e: RalentiVoiceEvent = { type: voiceEventName(ev[k + 1]), voice: entry.handle, contextTime: ev[k + 2] };
      if (e.type === 'ended') {
        this.handles.delete(ev[k]);
        const src = entry.source;
        if (src && --src.voiceCount === 0) this.voiced.delete(src);
      }
      entry.handle.deliver(e);
      for (const cb of this.listeners) cb(e);
    }
    const p = r.positions;
    for (let k = 0; k + 2 < p.length; k += 3) this.handles.get(p[k])?.handle.report(p[k + 1], p[k + 2], r.contextTime);
  }
}
