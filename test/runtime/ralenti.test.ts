import { describe, expect, it } from 'vitest';
import { Ralenti, RalentiOptionError, TuningError, defaultTuning, parseTuning, serializeTuning, type RalentiPlayOptions } from '../../runtime/index';
import { Engine } from '../../src/engine/index';
import { decodeSnapshot } from '../../runtime/protocol';
import { FakeWorkletNode, fakeContext } from './fake-worklet-node';

function setup(time = 0) {
  const node = new FakeWorkletNode();
  const context = fakeContext(time);
  const r = new Ralenti({ context, node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 8 });
  return { node, context, r };
}

const tone = () => ({ channels: [new Float32Array(480).fill(0.25)], sampleRate: 48000 });

describe('Ralenti main-thread API', () => {
  it('uploads a copy of the channels and transfers the copy, leaving the caller\'s arrays intact', () => {
    const { node, r } = setup();
    const data = tone();
    const sound = r.load(data);
    expect(sound).toMatchObject({ channels: 1, sampleRate: 48000, frames: 480, duration: 0.01 });
    const [{ command, transfer }] = node.sent;
    expect(command.type).toBe('add-sound');
    if (command.type !== 'add-sound') return;
    expect(command.channels[0]).toEqual(data.channels[0]);
    expect(transfer).toHaveLength(1);
    expect(transfer[0]).not.toBe(data.channels[0].buffer);
    expect(data.channels[0].length).toBe(480);
  });

  it.each([
    [{ gainDb: 25 }, 'play.gainDb'],
    [{ gainDb: NaN }, 'play.gainDb'],
    [{ pitchRange: [100, -100] }, 'play.pitchRange[1]'],
    [{ gainRange: [-70, 0] }, 'play.gainRange[0]'],
    [{ ratio: 0 }, 'play.ratio'],
    [{ ratio: 5 }, 'play.ratio'],
    [{ group: 'weather' }, 'play.group'],
    [{ offsetSeconds: 1 }, 'play.offsetSeconds'],
    [{ loopStartSeconds: 0.002, loopEndSeconds: 0.001 }, 'play.loopEndSeconds'],
  ] as [RalentiPlayOptions, string][])('refuses play options %j with a RalentiOptionError naming %s and sends nothing', (options, field) => {
    const { node, r } = setup();
    const s = r.load(tone());
    node.sent = [];
    let err: unknown;
    try {
      r.play(s, options);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RalentiOptionError);
    expect((err as RalentiOptionError).field).toBe(field);
    expect(node.sent).toEqual([]);
  });

  it('sends play with the source id and distinct voice handles; voice calls address that handle', () => {
    const { node, r } = setup();
    const s = r.load(tone());
    const src = r.createSource();
    const a = r.play(s, { group: 'vehicles', loop: true, source: src });
    const b = r.play(s);
    expect(a.id).not.toBe(b.id);
    const plays = node.commands('play');
    expect(plays[0].options).toEqual({ group: 'vehicles', loop: true, sourceId: src.id });
    a.setGain(-20);
    a.setRatio(1.5);
    a.stop({ fade: 0.2 });
    expect(a.state).toBe('stopping');
    expect(node.commands('set-voice')).toEqual([
      { type: 'set-voice', voice: a.id, gain: Math.pow(10, -20 / 20) },
      { type: 'set-voice', voice: a.id, ratio: 1.5 },
    ]);
    expect(node.commands('stop')).toEqual([{ type: 'stop', voice: a.id, fadeSeconds: 0.2 }]);
    expect(() => a.setRatio(-1)).toThrow(RalentiOptionError);
  });

  it('refuses a disposed source', () => {
    const { r } = setup();
    const s = r.load(tone());
    const src = r.createSource();
    src.dispose();
    expect(() => r.play(s, { source: src })).toThrow(/play\.source/);
  });

  it('sends the listener and live sources in each snapshot, stamped with context time', () => {
    const { node, r, context } = setup(2);
    const a = r.createSource().setPosition(1, 2, 3);
    const b = r.createSource().setPosition(4, 5, 6).setVelocity(10, 0, 0);
    r.setListener({ position: { x: 0, y: 1, z: 0 }, forward: { x: 1, y: 0, z: 0 }, up: { x: 0, y: 1, z: 0 } });
    r.update();
    b.clearVelocity();
    a.dispose();
    context.currentTime = 2.5;
    r.update();
    const [first, second] = node.commands('snapshot').map((c) => decodeSnapshot(c.data)!);
    expect(first.time).toBe(2);
    expect(first.listener.forward).toEqual({ x: 1, y: 0, z: 0 });
    expect(first.sources).toEqual([
      { id: a.id, position: { x: 1, y: 2, z: 3 } },
      { id: b.id, position: { x: 4, y: 5, z: 6 }, velocity: { x: 10, y: 0, z: 0 } },
    ]);
    expect(second.time).toBe(2.5);
    expect(second.sources).toEqual([{ id: b.id, position: { x: 4, y: 5, z: 6 } }]);
  });

  it('ramps the time scale on the main thread as the request sent to the worklet describes', () => {
    const { node, r, context } = setup(10);
    r.setTimeScale(0.5, { ramp: 2, easing: 'linear' });
    expect(node.commands('time-scale')).toEqual([
      { type: 'time-scale', request: { target: 0.5, rampSeconds: 2, easing: 'linear', startTime: 10 } },
    ]);
    context.currentTime = 11;
    expect(r.timeScale).toBeCloseTo(0.75, 12);
    context.currentTime = 13;
    expect(r.timeScale).toBe(0.5);
  });

  it('takes the tuning\'s ramp-in time when slowing down and no ramp is given', () => {
    const { node, r } = setup(0);
    r.setTimeScale(0.25);
    const [c] = node.commands('time-scale');
    expect(c.request.rampSeconds).toBe(defaultTuning.timeFlow.rampInSeconds);
    expect(c.request.easing).toBe(defaultTuning.timeFlow.easing);
  });

  it.each([[-0.1], [5], [NaN]])('refuses time scale %d naming setTimeScale.target', (v) => {
    const { r } = setup();
    expect(() => r.setTimeScale(v)).toThrow(/setTimeScale\.target/);
  });

  it('keeps the running tuning and sends nothing when a tuning fails to parse', () => {
    const { node, r } = setup();
    const before = r.tuning;
    expect(() => r.setTuning({ version: 1, groups: 'none' })).toThrow(TuningError);
    expect(r.tuning).toBe(before);
    expect(node.commands('tuning')).toEqual([]);
    const t = r.setTuning(JSON.parse(JSON.stringify(defaultTuning)));
    expect(r.tuning).toBe(t);
    expect(node.commands('tuning')).toHaveLength(1);
  });

  it('keeps the latest stats and voices, relays audio-thread errors, and resolves flush on synced', async () => {
    const { node, r } = setup();
    const errors: string[] = [];
    const off = r.onError((e) => errors.push(`${e.where}:${e.message}`));
    const stats = { ...r.stats, activeVoices: 3, errors: 1 };
    node.deliver({ type: 'stats', contextTime: 1, stats, voices: [] });
    node.deliver({ type: 'error', where: 'process', message: 'boom', count: 1 });
    off();
    node.deliver({ type: 'error', where: 'process', message: 'again', count: 2 });
    expect(r.stats.activeVoices).toBe(3);
    expect(errors).toEqual(['process:boom']);
    const flushed = r.flush();
    const [sync] = node.commands('sync');
    node.deliver({ type: 'synced', id: sync.id, contextTime: 1 });
    await expect(flushed).resolves.toBeUndefined();
  });

  it('holds complete stats before the first report: counters at their start, the tuning\'s tier, the same fields as an engine\'s', () => {
    const node = new FakeWorkletNode();
    const tuning = parseTuning({ ...JSON.parse(serializeTuning(defaultTuning)), resampler: { tier: 'high' } });
    const r = new Ralenti({ context: fakeContext(0), node: node as unknown as AudioWorkletNode, tuning, capacity: 8 });
    expect(r.stats).toMatchObject({ activeVoices: 0, steals: 0, errors: 0, timeScale: 1, tier: 'high', shockwaves: 0, lastShockwaveSource: -1 });
    expect(['wasm-simd', 'typescript']).toContain(r.stats.kernel);
    const engine = new Engine({ sampleRate: 48000, capacity: 1, tuning });
    expect(Object.keys(r.stats).sort()).toEqual(Object.keys(engine.stats).sort());
  });

  it('connects, disposes once, and refuses work afterwards', () => {
    const { node, r } = setup();
    const dest = {} as AudioNode;
    r.connect(dest);
    expect(node.connectedTo).toEqual([dest]);
    r.dispose();
    r.dispose();
    expect(node.closed).toBe(true);
    expect(() => r.load(tone())).toThrow(RalentiOptionError);
  });
});
