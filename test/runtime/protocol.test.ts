import { describe, expect, it } from 'vitest';
import {
  commandTransfer,
  decodeCommand,
  SnapshotDecoder,
  decodeSnapshot,
  encodeSnapshot,
  snapshotLength,
  snapshotSourceCount,
  type Command,
} from '../../runtime/protocol';
import type { EngineSnapshot } from '../../src/index';

const snapshot: EngineSnapshot = {
  time: 1.25,
  listener: { position: { x: 1, y: 2, z: 3 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 }, velocity: { x: 4, y: 5, z: 6 } },
  sources: [
    { id: 7, position: { x: -1, y: 0.5, z: 10 } },
    { id: 9, position: { x: 2, y: 3, z: 4 }, velocity: { x: -30, y: 0, z: 1e-3 } },
  ],
};

describe('snapshot encoding', () => {
  it('round-trips listener, sources and optional velocities exactly', () => {
    const back = decodeSnapshot(encodeSnapshot(snapshot));
    expect(back).toEqual(snapshot);
  });

  it('leaves velocity absent when the sender gave none', () => {
    const back = decodeSnapshot(encodeSnapshot({ ...snapshot, listener: { ...snapshot.listener, velocity: undefined } }))!;
    expect('velocity' in back.listener).toBe(false);
    expect('velocity' in back.sources[0]).toBe(false);
  });

  it('shifts the time by the context-to-engine offset', () => {
    expect(decodeSnapshot(encodeSnapshot(snapshot), 0.25)!.time).toBe(1);
  });

  it('reuses a long-enough output array and grows a short one', () => {
    const big = new Float64Array(snapshotLength(5));
    expect(encodeSnapshot(snapshot, big)).toBe(big);
    const small = new Float64Array(snapshotLength(1));
    const grown = encodeSnapshot(snapshot, small);
    expect(grown).not.toBe(small);
    expect(grown.length).toBe(snapshotLength(2));
  });

  it('gives fresh objects on every decode (nothing shared between results)', () => {
    const d = encodeSnapshot(snapshot);
    const a = decodeSnapshot(d)!;
    const b = decodeSnapshot(d)!;
    expect(a.listener.position).not.toBe(b.listener.position);
    expect(a.sources[0]).not.toBe(b.sources[0]);
  });

  it('decodes into one reused object: the same snapshot, listener, source states and list for every count of a band', () => {
    const decoder = new SnapshotDecoder(8);
    const first = decoder.decode(encodeSnapshot(snapshot))!;
    expect(first).toEqual({ ...snapshot, sources: [{ ...snapshot.sources[0], velocity: undefined }, snapshot.sources[1]] });
    const source0 = first.sources[0];
    const list = first.sources;
    const next = decoder.decode(encodeSnapshot({ ...snapshot, time: 2, sources: [snapshot.sources[1]] }), 0.5)!;
    expect(next).toBe(first);
    expect(next.listener).toBe(first.listener);
    expect(next.sources).toBe(list);
    expect(next.sources[0]).toBe(source0);
    expect(next).toEqual({ ...snapshot, time: 1.5, sources: [snapshot.sources[1]] });
    // No velocity sent: undefined, so the engine estimates it (as for an absent one).
    const still = decoder.decode(encodeSnapshot({ ...snapshot, listener: { ...snapshot.listener, velocity: undefined }, sources: [snapshot.sources[0]] }))!;
    expect(still.listener.velocity).toBeUndefined();
    expect(still.sources[0].velocity).toBeUndefined();
  });

  it.each([[0], [1], [16], [17], [48], [49], [100], [112], [113], [200], [240], [241], [300]])(
    'decodes %i sources exactly after other counts (every band of a 240-source decoder, and beyond it)',
    (n) => {
      const decoder = new SnapshotDecoder(240);
      const make = (count: number, shift: number) => ({
        ...snapshot,
        sources: Array.from({ length: count }, (_, i) => (i % 2 === 0 ? { id: i + shift, position: { x: i, y: -i, z: 0.5 } } : { id: i, position: { x: 1, y: 2, z: 3 }, velocity: { x: i, y: 0, z: -1 } })),
      });
      for (const before of [300, 0, 17, 240, 5]) decoder.decode(encodeSnapshot(make(before, 1000)));
      const got = decoder.decode(encodeSnapshot(make(n, 0)))!;
      expect(got.sources).toHaveLength(n);
      expect(got).toEqual(make(n, 0));
    },
  );

  it.each([
    ['too short', new Float64Array(3)],
    ['wrong version', Float64Array.from({ length: 16 }, (_, i) => (i === 0 ? 99 : 0))],
    ['count beyond data', (() => { const d = encodeSnapshot(snapshot); d[15] = 3; return d; })()],
    ['fractional count', (() => { const d = encodeSnapshot(snapshot); d[15] = 1.5; return d; })()],
  ])('rejects a malformed encoding (%s)', (_name, d) => {
    expect(snapshotSourceCount(d)).toBe(-1);
    expect(decodeSnapshot(d)).toBeNull();
  });
});

describe('command decoding', () => {
  const good: Command[] = [
    { type: 'add-sound', sound: 1, channels: [new Float32Array(4), new Float32Array(4)], sampleRate: 44100 },
    { type: 'remove-sound', sound: 1 },
    { type: 'play', voice: 3, sound: 1, options: { group: 'effects', loop: true } },
    { type: 'stop', voice: 3, fadeSeconds: 0.1 },
    { type: 'stop', voice: 3 },
    { type: 'set-voice', voice: 3, gain: 0.5 },
    { type: 'snapshot', data: encodeSnapshot(snapshot) },
    { type: 'time-scale', request: { target: 0.5, rampSeconds: 1, easing: 'smooth', startTime: 2 } },
    { type: 'tuning', tuning: {} as never },
    { type: 'sync', id: 4 },
    { type: 'teleport', source: 7 },
    { type: 'remove-sound', sound: 2 },
  ];
  it.each(good.map((c) => [c.type, c] as const))('accepts a well-formed %s command unchanged', (_t, c) => {
    expect(decodeCommand(c)).toBe(c);
  });

  it.each([
    [null, 'command'],
    [{ type: 'dance' }, 'unknown type'],
    [{ type: 'add-sound', sound: 1, channels: [new Float32Array(4), new Float32Array(3)], sampleRate: 48000 }, 'add-sound.channels'],
    [{ type: 'add-sound', sound: 1, channels: [new Float64Array(4)], sampleRate: 48000 }, 'add-sound.channels'],
    [{ type: 'add-sound', sound: 1, channels: [new Float32Array(4)], sampleRate: NaN }, 'add-sound.sampleRate'],
    [{ type: 'add-sound', sound: -1, channels: [new Float32Array(4)], sampleRate: 48000 }, 'add-sound.sound'],
    [{ type: 'play', voice: 1.5, sound: 1, options: {} }, 'play.voice'],
    [{ type: 'play', voice: 1, sound: 1 }, 'play.options'],
    [{ type: 'stop', voice: 1, fadeSeconds: 'slow' }, 'stop.fadeSeconds'],
    [{ type: 'set-voice', voice: 1, ratio: '2' }, 'set-voice.ratio'],
    [{ type: 'snapshot', data: [1, 2] }, 'snapshot.data'],
    [{ type: 'time-scale', request: { target: 0.5 } }, 'time-scale.request'],
    [{ type: 'sync', id: 'x' }, 'sync.id'],
    [{ type: 'remove-sound', sound: 'a' }, 'remove-sound.sound'],
    [{ type: 'tuning', tuning: 'default' }, 'tuning.tuning'],
    [{ type: 'tables', tables: [{}] }, 'tables.tables'],
    [{ type: 'teleport', source: Infinity }, 'teleport.source'],
    [{ type: 'toString' }, 'unknown type'],
    [{ type: '__proto__' }, 'unknown type'],
  ])('rejects %j naming %s', (data, field) => {
    const r = decodeCommand(data);
    expect(typeof r).toBe('string');
    expect(r as string).toContain(field);
  });

  it('lists the channel buffers of a sound upload as transferables, and nothing for a snapshot', () => {
    const a = new Float32Array(8);
    const b = new Float32Array(8);
    expect(commandTransfer({ type: 'add-sound', sound: 1, channels: [a, b], sampleRate: 48000 })).toEqual([a.buffer, b.buffer]);
    expect(commandTransfer({ type: 'snapshot', data: new Float64Array(16) })).toEqual([]);
  });
});
