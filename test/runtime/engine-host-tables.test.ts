// The worklet host with tables designed on the main thread: the tuning's tier is ready at construction, another tier's
// WebAssembly layout is copied in one bounded slice per render quantum, and no table work happens on the audio thread.
import { describe, expect, it } from 'vitest';
import { EngineHost } from '../../runtime/worklet/engine-host';
import type { Report, StatsReport } from '../../runtime/protocol';
import { INSTALL_BYTES_PER_QUANTUM, KernelTable, WasmKernel, packAllTiers, packKernelTable } from '../../src/dsp/index';
import { defaultTuning, parseTuning, serializeTuning } from '../../src/tuning/index';
import { Ralenti } from '../../runtime/index';
import { FakeWorkletNode, fakeContext } from './fake-worklet-node';

const RATE = 48000;

function tuning(tier: string): unknown {
  const t = JSON.parse(serializeTuning(defaultTuning));
  t.resampler.tier = tier;
  return parseTuning(t);
}

describe('EngineHost kernel tables', () => {
  it('switches tier with every table designed on the main thread, installing the layout a slice per quantum', () => {
    // Main-thread work, done before the host exists.
    const initial = packAllTiers(RATE, 'standard');
    const high = packKernelTable('high', RATE, true);
    const designed = KernelTable.designCount;
    const built = WasmKernel.shared()!.stridesBuilt;
    const reports: Report[] = [];
    const host = new EngineHost({
      sampleRate: RATE,
      startContextTime: 0,
      processorOptions: { capacity: 4, maxSounds: 4, tuning: defaultTuning, statsIntervalSeconds: 0.05, tables: initial },
      post: (r) => reports.push(r),
    });
    const out = [new Float32Array(128), new Float32Array(128)];
    host.handle({ type: 'tables', tables: [high] });
    host.handle({ type: 'tuning', tuning: tuning('high') });
    let quanta = 0;
    while (host.engine.stats.tier !== 'high' && quanta < 10000) {
      host.process(out);
      quanta++;
    }
    expect(host.errors).toBe(0);
    expect(host.engine.stats.tier).toBe('high');
    // One slice per quantum: the layout took exactly as many quanta as it has slices.
    expect(quanta).toBe(Math.ceil(high.image!.bytes.length / INSTALL_BYTES_PER_QUANTUM));
    for (let b = 0; b < 40; b++) host.process(out); // past the next stats report (every 0.05 s)
    const last = reports.filter((r): r is StatsReport => r.type === 'stats').at(-1)!;
    expect(last.tables).toEqual({ designed, stridesBuilt: built, installing: 0 });
    expect(last.stats.tier).toBe('high');
  });

  it('sends a new tier\'s tables (buffers transferred) before the tuning that asks for it, once per tier', () => {
    const node = new FakeWorkletNode();
    const r = new Ralenti({ context: fakeContext(), node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 4, tableTiers: ['standard'] });
    const toHigh = JSON.parse(serializeTuning(tuning('high') as never));
    r.setTuning(toHigh);
    r.setTuning(toHigh);
    r.setTuning(JSON.parse(serializeTuning(defaultTuning)));
    expect(node.sent.map((s) => s.command.type)).toEqual(['tables', 'tuning', 'tuning', 'tuning']);
    const [tables] = node.commands('tables');
    expect(tables.tables.map((t) => t.table.name)).toEqual(['high']);
    expect(tables.tables[0].image).not.toBeNull();
    expect(node.sent[0].transfer).toHaveLength(3); // samples, phase-major rows, WebAssembly layout
    // Without tableTiers (a node built by hand) the processor designs its own: no tables are sent.
    const plain = new FakeWorkletNode();
    new Ralenti({ context: fakeContext(), node: plain as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 4 }).setTuning(toHigh);
    expect(plain.commands('tables')).toEqual([]);
  });
});
