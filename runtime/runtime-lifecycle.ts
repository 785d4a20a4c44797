// A runtime's life on the main thread: open until dispose() or until its AudioContext closes; the flush() waiters
// that must settle either way; the audio thread's answer to the close command; and the listeners of audio-thread errors.
import type { ClosedReport, Command } from './protocol';
import type { RalentiAudioError } from './ralenti-types';
import { RalentiClosedError } from './runtime-error';

/** Open/closed state, pending flushes and error listeners of one runtime. */
export class RuntimeLifecycle {
  private disposedFlag = false;
  private contextClosed = false;
  private nextSync = 1;
  private readonly syncWaiters = new Map<number, () => void>();
  private readonly errorListeners = new Set<(e: RalentiAudioError) => void>();
  /** The close command's answer: null until asked for, and where none can come. */
  private answer: Promise<ClosedReport | null> = Promise.resolve(null);
  private endAnswer: (r: ClosedReport | null) => void = () => {};

  /** Watches `context`: once it closes, every waiting flush settles (a closed context answers no more messages). */
  constructor(private readonly context: BaseAudioContext) {
    const events: Partial<Pick<EventTarget, 'addEventListener'>> = context;
    events.addEventListener?.('statechange', () => {
      if (context.state === 'closed') this.abandon();
    });
  }

  /** True after dispose(). */
  get disposed(): boolean {
    return this.disposedFlag;
  }

  /** True after dispose() or once the context is closed (a closed context stays closed). */
  get closed(): boolean {
    if (!this.contextClosed && this.context.state === 'closed') this.contextClosed = true;
    return this.disposedFlag || this.contextClosed;
  }

  /** Throws RalentiClosedError naming call `what` after dispose() or once the context is closed. */
  alive(what: string): void {
    if (this.disposedFlag) throw new RalentiClosedError(what, 'disposed');
    if (this.closed) throw new RalentiClosedError(what, 'closed');
  }

  /** A promise that settles when the worklet answers the 'sync' command sent through `send`; at once when closed. */
  flush(send: (c: Command) => void): Promise<void> {
    if (this.closed) return Promise.resolve();
    const id = this.nextSync++;
    return new Promise((resolve) => {
      this.syncWaiters.set(id, resolve);
      send({ type: 'sync', id });
    });
  }

  /** The worklet answered sync `id`: its flush settles. */
  synced(id: number): void {
    const w = this.syncWaiters.get(id);
    this.syncWaiters.delete(id);
    w?.();
  }

  /** Settles every waiting flush (the worklet will answer no more on the node's port). */
  settle(): void {
    for (const resolve of this.syncWaiters.values()) resolve();
    this.syncWaiters.clear();
  }

  /** The audio thread is gone (its context closed, or the processor failed): settles the flushes and the close answer (null). */
  abandon(): void {
    this.settle();
    this.endAnswer(null);
  }

  /**
   * A port for the close command's answer, which settles `closedAnswer` with the worklet's ClosedReport; undefined where
   * no answer can come (the context is closed) or MessagePort is missing, and the answer is then null.
   */
  private replyPort(): MessagePort | undefined {
    if (this.closed || typeof MessageChannel !== 'function') return undefined;
    const channel = new MessageChannel();
    const port = channel.port1;
    this.answer = new Promise((resolve) => {
      this.endAnswer = (r) => {
        this.endAnswer = () => {};
        port.onmessage = null;
        port.close();
        resolve(r);
      };
    });
    port.onmessage = (e: MessageEvent<ClosedReport>) => this.endAnswer(e.data?.type === 'closed' ? e.data : null);
    return channel.port2;
  }

  /**
   * Ends the runtime on `node`: sends the close command (with a reply port) through `send`, marks it disposed, then
   * disconnects the node and closes its port; returns the close answer (the same promise on later calls).
   */
  close(node: AudioWorkletNode, send: (c: Command) => void): Promise<ClosedReport | null> {
    if (this.disposedFlag) return this.answer;
    send({ type: 'close', reply: this.replyPort() });
    this.dispose();
    try {
      node.disconnect();
    } catch {
      // Already disconnected or its context closed: nothing left to release.
    }
    node.port.onmessage = null;
    node.port.close();
    return this.answer;
  }

  /** The audio thread's answer to the close command (null where none came); resolved at once before a close is sent. */
  get closedAnswer(): Promise<ClosedReport | null> {
    return this.answer;
  }

  /** Marks the runtime disposed and settles the waiting flushes; false when it already was. */
  dispose(): boolean {
    if (this.disposedFlag) return false;
    this.disposedFlag = true;
    this.settle();
    return true;
  }

  /** Adds an error listener; returns a function that removes it. */
  onError(cb: (e: RalentiAudioError) => void): () => void {
    this.errorListeners.add(cb);
    return () => this.errorListeners.delete(cb);
  }

  /** Calls every error listener with `e`. */
  emitError(e: RalentiAudioError): void {
    for (const cb of this.errorListeners) cb(e);
  }
}
