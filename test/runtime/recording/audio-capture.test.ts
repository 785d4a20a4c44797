// AudioCapture on the main thread, with a stand-in AudioWorkletNode: bounded memory and page-clock alignment.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AudioCapture } from '../../../runtime/recording';
import { CAPTURE_CHUNK_FRAMES } from '../../../runtime/recording/capture-protocol';

class FakeNode {
  static last: FakeNode | null = null;
  readonly lent: Float32Array[] = [];
  readonly port = {
    onmessage: null as ((e: { data: unknown }) => void) | null,
    postMessage: (m: { type: string; left?: Float32Array }) => {
      if (m.type === 'chunk') this.lent.push(m.left!);
    },
  };
  constructor() {
    FakeNode.last = this;
  }
  connect(): void {}
  disconnect(): void {}
}

const scope = globalThis as unknown as Record<string, unknown>;
beforeAll(() => {
  scope.AudioWorkletNode = FakeNode;
});
afterAll(() => {
  delete scope.AudioWorkletNode;
});

const sr = 8192;
const context = { sampleRate: sr, currentTime: 10, destination: {} } as unknown as BaseAudioContext;
const source = { connect() {}, disconnect() {} } as unknown as AudioNode;

/** The audio thread's side: returns `count` full chunks of value v, starting at context time t0. */
function deliver(count: number, t0: number, v = 0.5): void {
  const node = FakeNode.last!;
  for (let k = 0; k < count; k++) {
    const left = new Float32Array(CAPTURE_CHUNK_FRAMES).fill(v);
    node.port.onmessage!({ data: { type: 'chunk', left, right: left.slice(), frames: CAPTURE_CHUNK_FRAMES, startTime: t0 + (k * CAPTURE_CHUNK_FRAMES) / sr } });
  }
  node.port.onmessage!({ data: { type: 'chunk', left: new Float32Array(CAPTURE_CHUNK_FRAMES), right: new Float32Array(CAPTURE_CHUNK_FRAMES), frames: 0, startTime: 0 } });
}

describe('AudioCapture', () => {
  it('lends its chunks to the audio thread at the start and keeps lending while it runs', () => {
    const c = new AudioCapture(context, source, { chunksInFlight: 4 });
    c.start(100);
    expect(FakeNode.last!.lent.length).toBe(4);
    deliver(2, 10);
    expect(FakeNode.last!.lent.length).toBe(4 + 3);
  });

  it('keeps at most maxSeconds and counts the rest as dropped', async () => {
    const c = new AudioCapture(context, source, { maxSeconds: 1 });
    c.start(100);
    deliver(5, 10); // 2.5 s of audio
    const got = await c.stop(100);
    expect(got.channels[0].length).toBe(sr); // two chunks of 4096 frames at 8192 Hz
    expect(got.droppedFrames).toBe(3 * CAPTURE_CHUNK_FRAMES);
  });

  it('puts sample 0 at the page time asked for: earlier audio is cut, a late start is padded with silence', async () => {
    // Page time 100 s is context time 10 s (start). The recording's time 0 is page time 100.25 s: the first 0.25 s of
    // audio (from context time 10) is cut. Audio starting at context time 10.5 gets 0.25 s of silence in front.
    const a = new AudioCapture(context, source);
    a.start(100);
    deliver(1, 10);
    const cut = await a.stop(100.25);
    expect(cut.channels[0].length).toBe(CAPTURE_CHUNK_FRAMES - sr / 4);
    expect(cut.channels[0][0]).toBe(0.5);
    const b = new AudioCapture(context, source);
    b.start(100);
    deliver(1, 10.5);
    const padded = await b.stop(100.25);
    expect(padded.channels[0].length).toBe(CAPTURE_CHUNK_FRAMES + sr / 4);
    expect(padded.channels[0][sr / 4 - 1]).toBe(0);
    expect(padded.channels[0][sr / 4]).toBe(0.5);
  });

  it('refuses options out of range', () => {
    expect(() => new AudioCapture(context, source, { maxSeconds: 0 })).toThrow(/maxSeconds/);
    expect(() => new AudioCapture(context, source, { chunksInFlight: 1 })).toThrow(/chunksInFlight/);
  });
});
