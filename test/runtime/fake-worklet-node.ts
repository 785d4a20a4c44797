// A stand-in for AudioWorkletNode on the main thread: records posted commands and can deliver reports.
import type { Command, Report } from '../../runtime/protocol';

/** Fake node: `sent` holds every command (with its transfer list); `deliver` plays a report into onmessage. */
export class FakeWorkletNode {
  sent: { command: Command; transfer: Transferable[] }[] = [];
  connectedTo: unknown[] = [];
  onprocessorerror: (() => void) | null = null;
  closed = false;
  port = {
    onmessage: null as ((e: MessageEvent) => void) | null,
    postMessage: (command: Command, transfer: Transferable[] = []) => {
      // Like a real port: the message is structured-cloned and transferred buffers are detached.
      this.sent.push({ command: structuredClone(command, { transfer }), transfer });
    },
    close: () => {
      this.closed = true;
    },
  };
  connect(node: unknown): void {
    this.connectedTo.push(node);
  }
  disconnect(): void {
    this.connectedTo = [];
  }
  deliver(report: Report): void {
    this.port.onmessage?.({ data: report } as MessageEvent);
  }
  commands<T extends Command['type']>(type: T): Extract<Command, { type: T }>[] {
    return this.sent.map((s) => s.command).filter((c): c is Extract<Command, { type: T }> => c.type === type);
  }
}

/** A context with a settable currentTime. */
export function fakeContext(currentTime = 0): BaseAudioContext & { currentTime: number } {
  return { currentTime, sampleRate: 48000 } as unknown as BaseAudioContext & { currentTime: number };
}
