// The worklet host when its node is closed: the 'close' command disposes the engine, hands its module memory and the
// tables installed for it back to the kernel at once, answers on the command's reply port (Ralenti.dispose() resolves
// with that report), and ends the processor (process() returns false, silent).
import { describe, expect, it } from 'vitest';
import { EngineHost } from '../../runtime/worklet/engine-host';
import type { Report } from '../../runtime/protocol';
import { WasmKernel, packAllTiers } from '../../src/dsp/index';
import { defaultTuning } from '../../src/tuning/index';
import { EVENT_ENDED, EVENT_VIRTUAL, VOICE_EVENT_CAPACITY } from '../../src/engine/index';
import { Ralenti } from '../../runtime/index';
import { FakeWorkletNode, fakeContext } from './fake-worklet-node';

const RATE = 48000;

function host(withTables: boolean): { h: EngineHost; reports: Report[] } {
  const reports: Report[] = [];
  const h = new EngineHost({
    sampleRate: RATE,
    startContextTime: 0,
    processorOptions: { capacity: 4, maxSounds: 4, tuning: defaultTuning, statsIntervalSeconds: 0.05, tables: withTables ? packAllTiers(RATE, 'standard') : undefined },
    post: (r) => reports.push(r),
  });
  return { h, reports };
}

const out = () => [new Float32Array(128).fill(1), new Float32Array(128).fill(1)];

describe('EngineHost on close', () => {
  it('disposes its engine on the close command, ends the processor silent and ignores later messages', () => {
    const { h, reports } = host(false);
    const sine = new Float32Array(4800).map((_, i) => 0.5 * Math.sin((2 * Math.PI * 440 * i) / RATE));
    h.handle({ type: 'add-sound', sound: 1, channels: [sine], sampleRate: RATE });
    h.handle({ type: 'play', voice: 7, sound: 1, options: { loop: true } });
    expect(h.process(out())).toBe(true);
    expect(h.mappedVoices).toBe(1);
    h.handle({ type: 'close' });
    expect(h.disposed).toBe(true);
    expect(h.engine.disposed).toBe(true);
    expect(h.mappedVoices).toBe(0);
    const o = out();
    expect(h.process(o)).toBe(false);
    expect(o.every((c) => c.every((x) => x === 0))).toBe(true);
    const count = reports.length;
    h.handle({ type: 'play', voice: 8, sound: 1, options: {} });
    h.sendStats();
    expect(reports.length).toBe(count);
    expect(h.errors).toBe(0);
    h.dispose(); // idempotent
  });

  const kernel = WasmKernel.shared();

  it.runIf(kernel !== null)('hands the engine regions and its installed tables back: 12 open/close cycles keep module memory bounded', () => {
    const k = kernel!;
    const cycle = (check: (h: EngineHost) => void) => {
      const { h } = host(true);
      const sound = new Float32Array(RATE).map((_, j) => 0.3 * Math.sin(j * 0.05));
      h.handle({ type: 'add-sound', sound: 1, channels: [sound, sound.slice()], sampleRate: RATE });
      h.handle({ type: 'play', voice: 1, sound: 1, options: { loop: true, ratio: 0.7 } });
      for (let b = 0; b < 4; b++) h.process(out());
      check(h);
      h.handle({ type: 'close' });
    };
    cycle(() => {}); // the first cycle may grow memory once (and place the kernel's shared spans)
    const inUse = k.bytesInUse;
    const memory = k.exports.memory.buffer.byteLength;
    for (let i = 0; i < 12; i++) {
      // Each host holds its own copy of the standard tier's layout (about 4 MB) and its sound while open.
      cycle(() => expect(k.bytesInUse).toBeGreaterThan(inUse + 4_000_000));
      expect(k.bytesInUse).toBe(inUse);
    }
    expect(k.exports.memory.buffer.byteLength).toBe(memory);
  });

  it('is told to close by Ralenti.dispose before the port closes', () => {
    const node = new FakeWorkletNode();
    const r = new Ralenti({ context: fakeContext(), node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 4 });
    const answer = r.dispose();
    expect(r.dispose()).toBe(answer);
    expect(node.sent.map((s) => s.command.type)).toEqual(['close']);
    expect(node.closed).toBe(true);
  });

  it("answers the close on its reply port once the engine is disposed; Ralenti.dispose() resolves with that report", async () => {
    const node = new FakeWorkletNode();
    const r = new Ralenti({ context: fakeContext(), node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 4 });
    const { h } = host(true);
    const sound = new Float32Array(RATE / 2).map((_, j) => 0.3 * Math.sin(j * 0.05));
    h.handle({ type: 'add-sound', sound: 1, channels: [sound], sampleRate: RATE });
    h.handle({ type: 'play', voice: 1, sound: 1, options: { loop: true } });
    for (let b = 0; b < 4; b++) h.process(out());
    const before = kernel?.bytesInUse ?? 0;
    const answer = r.dispose();
    // The node's port is closed at once; the answer comes on the reply port the close command carried (transferred).
    expect(node.closed).toBe(true);
    const close = node.commands('close')[0];
    expect(close.reply).toBeDefined();
    h.handle(close);
    const report = await answer;
    expect(h.engine.disposed).toBe(true);
    expect(report).toMatchObject({ type: 'closed', engineDisposed: true });
    if (kernel === null) expect(report!.kernel).toBeNull();
    else {
      // Its regions (scratch, bus, the resident sound: 4 bytes a frame) and the installed standard-tier layout went back.
      expect(report!.kernel!.bytesInUse).toBe(kernel.bytesInUse);
      expect(report!.kernel!.bytesReleased).toBe(before - kernel.bytesInUse);
      expect(report!.kernel!.bytesReleased).toBeGreaterThan(4 * sound.length + 4_000_000);
    }
    expect(h.process(out())).toBe(false);
  });

  it('resolves dispose() with null at once on a closed context (no answer can come)', async () => {
    const node = new FakeWorkletNode();
    const context = Object.assign(fakeContext(), { state: 'closed' });
    const r = new Ralenti({ context, node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 4 });
    await expect(r.dispose()).resolves.toBeNull();
    expect(node.commands('close')[0].reply).toBeUndefined();
  });

  it("forgets a voice whose 'ended' event was lost to a full event ring, and still tells the main thread it ended", () => {
    const { h, reports } = host(false);
    const sine = new Float32Array(4800).map((_, i) => 0.5 * Math.sin((2 * Math.PI * 440 * i) / RATE));
    h.handle({ type: 'add-sound', sound: 1, channels: [sine], sampleRate: RATE });
    h.handle({ type: 'play', voice: 7, sound: 1, options: { loop: true } });
    h.process(out());
    // Fill the ring with events of no mapped voice, so that the voice's 'ended' is dropped when it frees.
    for (let i = 0; i < VOICE_EVENT_CAPACITY; i++) h.engine.events.push(EVENT_VIRTUAL, 99_999);
    const dropped = h.engine.events.dropped;
    h.handle({ type: 'stop', voice: 7, fadeSeconds: 0 });
    h.process(out());
    expect(h.engine.events.dropped).toBeGreaterThan(dropped); // the voice's 'ended' never reached the ring
    expect(h.mappedVoices).toBe(0);
    const ended = reports.filter((r) => r.type === 'voice-events').flatMap((r) => (r.type === 'voice-events' ? Array.from(r.events) : []));
    const triples = Array.from({ length: ended.length / 3 }, (_, k) => [ended[3 * k], ended[3 * k + 1]]);
    expect(triples).toContainEqual([7, EVENT_ENDED]);
  });
});
