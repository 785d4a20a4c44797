// The audio-thread capture tap in Node, with the few AudioWorkletGlobalScope names it uses stood in by the test:
// it fills only the chunks lent to it, hands each back full, counts what it cannot store, and flushes on stop.
import { beforeAll, describe, expect, it } from 'vitest';
import { CAPTURE_CHUNK_FRAMES, CAPTURE_PROCESSOR_NAME, type CaptureReport } from '../../../runtime/recording/capture-protocol';

type Processor = { port: FakePort; process(inputs: Float32Array[][]): boolean };
class FakePort {
  onmessage: ((e: { data: unknown }) => void) | null = null;
  readonly sent: CaptureReport[] = [];
  postMessage(m: CaptureReport): void {
    this.sent.push(m);
  }
}

let Capture: new () => Processor;
const scope = globalThis as unknown as Record<string, unknown>;

beforeAll(async () => {
  scope.sampleRate = 48000;
  scope.currentTime = 0;
  scope.AudioWorkletProcessor = class {
    readonly port = new FakePort();
  };
  scope.registerProcessor = (name: string, cls: new () => Processor) => {
    if (name === CAPTURE_PROCESSOR_NAME) Capture = cls;
  };
  await import('../../../runtime/recording/capture-processor');
});

function quantum(start: number): Float32Array[][] {
  const l = Float32Array.from({ length: 128 }, (_, i) => start + i);
  return [[l, Float32Array.from(l, (x) => -x)]];
}

const lend = (p: Processor) => p.port.onmessage!({ data: { type: 'chunk', left: new Float32Array(CAPTURE_CHUNK_FRAMES), right: new Float32Array(CAPTURE_CHUNK_FRAMES) } });

describe('capture processor', () => {
  it('hands back each lent chunk full and in order, with the context time of its first frame', () => {
    const p = new Capture();
    lend(p);
    lend(p);
    const quanta = (2 * CAPTURE_CHUNK_FRAMES) / 128;
    for (let q = 0; q < quanta; q++) {
      scope.currentTime = (q * 128) / 48000;
      expect(p.process(quantum(q * 128))).toBe(true);
    }
    const chunks = p.port.sent.filter((m) => m.type === 'chunk');
    expect(chunks.map((c) => c.type === 'chunk' && [c.frames, c.startTime])).toEqual([
      [CAPTURE_CHUNK_FRAMES, 0],
      [CAPTURE_CHUNK_FRAMES, CAPTURE_CHUNK_FRAMES / 48000],
    ]);
    const second = chunks[1];
    if (second.type !== 'chunk') return;
    expect(second.left[0]).toBe(CAPTURE_CHUNK_FRAMES);
    expect(second.right[CAPTURE_CHUNK_FRAMES - 1]).toBe(-(2 * CAPTURE_CHUNK_FRAMES - 1));
  });

  it('counts frames it has no chunk for instead of buffering them, and reports the gap when a chunk arrives', () => {
    const p = new Capture();
    for (let q = 0; q < 10; q++) p.process(quantum(0));
    expect(p.port.sent).toEqual([]);
    lend(p);
    scope.currentTime = 1;
    p.process(quantum(0));
    expect(p.port.sent).toEqual([{ type: 'dropped', frames: 1280, startTime: expect.any(Number) }]);
  });

  it('flushes the part-filled chunk on stop and then stops processing', () => {
    const p = new Capture();
    lend(p);
    for (let q = 0; q < 3; q++) p.process(quantum(q * 128));
    p.port.onmessage!({ data: { type: 'stop' } });
    const last = p.port.sent[p.port.sent.length - 1];
    expect(last.type === 'chunk' && last.frames).toBe(384);
    expect(p.process(quantum(0))).toBe(false);
  });
});
