// Audio-thread side of the recording capture: copies its stereo input, render quantum by render quantum, into chunks
// the main thread lends it, and hands each full chunk back. Allocation-free: chunks come from the main thread and are
// transferred back; with no chunk to fill, frames are counted as dropped (reported once per gap), never buffered.
import { CAPTURE_PROCESSOR_NAME, type CaptureCommand, type CaptureReport } from './capture-protocol';

class CaptureProcessor extends AudioWorkletProcessor {
  private readonly free: { left: Float32Array; right: Float32Array }[] = [];
  private current: { left: Float32Array; right: Float32Array } | null = null;
  private filled = 0;
  private chunkStart = 0;
  private dropped = 0;
  private dropStart = 0;
  private stopped = false;

  constructor() {
    super();
    this.port.onmessage = (event: MessageEvent<CaptureCommand>): void => {
      const m = event.data;
      if (m.type === 'chunk') this.free.push({ left: m.left, right: m.right });
      else this.stop();
    };
  }

  private post(report: CaptureReport, transfer: ArrayBuffer[] = []): void {
    this.port.postMessage(report, transfer);
  }

  private flush(): void {
    const c = this.current;
    if (c && this.filled > 0) this.post({ type: 'chunk', left: c.left, right: c.right, frames: this.filled, startTime: this.chunkStart }, [c.left.buffer as ArrayBuffer, c.right.buffer as ArrayBuffer]);
    this.current = null;
    this.filled = 0;
  }

  private stop(): void {
    if (this.stopped) return;
    this.flush();
    if (this.dropped > 0) this.post({ type: 'dropped', frames: this.dropped, startTime: this.dropStart });
    this.stopped = true;
  }

  process(inputs: Float32Array[][]): boolean {
    if (this.stopped) return false;
    const input = inputs[0] ?? [];
    const frames = input[0]?.length ?? 128;
    let offset = 0;
    while (offset < frames) {
      if (this.current === null) {
        const next = this.free.shift();
        if (next === undefined) {
          if (this.dropped === 0) this.dropStart = currentTime + offset / sampleRate;
          this.dropped += frames - offset;
          return true;
        }
        if (this.dropped > 0) {
          this.post({ type: 'dropped', frames: this.dropped, startTime: this.dropStart });
          this.dropped = 0;
        }
        this.current = next;
        this.chunkStart = currentTime + offset / sampleRate;
      }
      const c = this.current;
      const n = Math.min(frames - offset, c.left.length - this.filled);
      const l = input[0];
      const r = input[1] ?? input[0];
      for (let i = 0; i < n; i++) {
        c.left[this.filled + i] = l ? l[offset + i] : 0;
        c.right[this.filled + i] = r ? r[offset + i] : 0;
      }
      this.filled += n;
      offset += n;
      if (this.filled === c.left.length) this.flush();
    }
    return true;
  }
}

registerProcessor(CAPTURE_PROCESSOR_NAME, CaptureProcessor);
