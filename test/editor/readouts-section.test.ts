// @vitest-environment jsdom
// The live readouts of the editor: engine load from the worklet's render-time measurement, and voice counts.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { EditorPanel } from '../../editor/index';
import { Ralenti, defaultTuning } from '../../runtime/index';
import { FakeWorkletNode } from '../runtime/fake-worklet-node';

function fakeParam(value: number) {
  return { value, setTargetAtTime: () => undefined, cancelScheduledValues: () => undefined, setValueAtTime: () => undefined };
}
function fakeNode(extra: Record<string, unknown> = {}) {
  return { connect: () => undefined, disconnect: () => undefined, ...extra };
}

function setup() {
  const context = {
    currentTime: 0,
    sampleRate: 48000,
    createAnalyser: () => fakeNode({ fftSize: 2048, frequencyBinCount: 1024, smoothingTimeConstant: 0, minDecibels: -100, maxDecibels: -30, getFloatFrequencyData: () => undefined }),
    createGain: () => fakeNode({ gain: fakeParam(1) }),
  } as unknown as BaseAudioContext;
  const node = new FakeWorkletNode();
  const ralenti = new Ralenti({ context, node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 16 });
  const container = document.createElement('div');
  document.body.appendChild(container);
  const gain = () => fakeNode({ gain: fakeParam(0.125) }) as unknown as GainNode;
  const panel = new EditorPanel({ ralenti, container, master: gain(), engineBus: gain(), voices: [], comparison: [] });
  // The readouts are tweakpane monitors, refreshed by its interval ticker.
  const row = (label: string) => {
    panel.update();
    vi.advanceTimersByTime(1000);
    const el = [...container.querySelectorAll('.tp-lblv')].find((e) => e.querySelector('.tp-lblv_l')?.textContent === label);
    return (el?.querySelector('input') as HTMLInputElement | null)?.value;
  };
  return { panel, ralenti, node, row };
}

afterEach(() => {
  vi.useRealTimers();
  document.body.innerHTML = '';
});

describe('editor readouts', () => {
  it('shows the engine load the worklet measured, with its averaging, and "not measured" before any report', () => {
    vi.useFakeTimers();
    const { panel, node, ralenti, row } = setup();
    expect(row('engine load')).toBe('not measured');
    node.deliver({ type: 'stats', contextTime: 1, stats: ralenti.stats, voices: [], load: { fraction: 0.0425, clock: 'Date.now', averageSeconds: 1 } });
    expect(ralenti.renderLoad).toEqual({ fraction: 0.0425, clock: 'Date.now', averageSeconds: 1 });
    expect(row('engine load')).toBe('4.3 % · 1 s avg (ms clock)');
    node.deliver({ type: 'stats', contextTime: 2, stats: ralenti.stats, voices: [], load: { fraction: 0.5, clock: 'performance.now', averageSeconds: 1 } });
    expect(row('engine load')).toBe('50.0 % · 1 s avg');
    // A host without a clock reports null: the readout says so instead of showing 0 %.
    node.deliver({ type: 'stats', contextTime: 3, stats: ralenti.stats, voices: [], load: null });
    expect(row('engine load')).toBe('not measured');
    panel.dispose();
  });

  it('shows voices playing against the pool capacity', () => {
    vi.useFakeTimers();
    const { panel, node, ralenti, row } = setup();
    node.deliver({ type: 'stats', contextTime: 1, stats: { ...ralenti.stats, activeVoices: 5, virtualVoices: 2 }, voices: [] });
    expect(row('voices playing')).toBe('5 of 16');
    expect(row('voices virtual')).toBe('2');
    panel.dispose();
  });
});
