// The main-thread side of the game-facing controls: errors at once, closed/disposed runtimes, group buses, voice
// events and state, positions, source capping before encoding, spatial settings sent with update().
import { describe, expect, it } from 'vitest';
import { Ralenti, RalentiClosedError, RalentiOptionError, defaultTuning, type RalentiVoiceEvent } from '../../runtime/index';
import { decodeSnapshot } from '../../runtime/protocol';
import { EVENT_AUDIBLE, EVENT_ENDED, EVENT_STOLEN, EVENT_VIRTUAL } from '../../src/engine';
import { FakeWorkletNode, fakeContext } from './fake-worklet-node';

function setup(time = 0, maxSources = 256) {
  const node = new FakeWorkletNode();
  const context = fakeContext(time) as ReturnType<typeof fakeContext> & { state: string };
  context.state = 'running';
  const r = new Ralenti({ context, node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 8, maxSources });
  return { node, context, r };
}

const tone = () => ({ channels: [new Float32Array(4800).fill(0.25)], sampleRate: 48000 });

describe('Ralenti errors', () => {
  it('throws at once when playing a sound that was never loaded or was unloaded, sending nothing', () => {
    const { node, r } = setup();
    const other = setup().r.load(tone());
    const s = r.load(tone());
    r.unload(s);
    node.sent = [];
    for (const sound of [other, s]) expect(() => r.play(sound)).toThrow(expect.objectContaining({ field: 'play.sound' }));
    expect(node.sent).toEqual([]);
  });

  it('throws for an unknown group with the tuning\'s group names, in play and in every group call', () => {
    const { r } = setup();
    const s = r.load(tone());
    expect(() => r.play(s, { group: 'weather' })).toThrow(/unknown group "weather" \(tuning has: .*effects/);
    expect(() => r.setGroupVolume('weather', -6)).toThrow(expect.objectContaining({ field: 'setGroupVolume.group' }));
    expect(() => r.setGroupMute('weather', true)).toThrow(RalentiOptionError);
    expect(() => r.setGroupSolo('weather', true)).toThrow(RalentiOptionError);
    expect(() => r.pause('weather')).toThrow(RalentiOptionError);
    expect(() => r.groupOutput('effects')).toThrow(expect.objectContaining({ field: 'groupOutput.group' }));
  });

  it.each(['dispose', 'close'])('throws RalentiClosedError from every call after %s, and flush() still settles', async (how) => {
    const { r, context } = setup();
    const s = r.load(tone());
    const v = r.play(s);
    const pending = r.flush();
    if (how === 'dispose') r.dispose();
    else context.state = 'closed';
    if (how === 'close') await r.flush(); // settles at once on a closed context
    const calls: [string, () => unknown][] = [
      ['load', () => r.load(tone())],
      ['play', () => r.play(s)],
      ['update', () => r.update()],
      ['pause', () => r.pause()],
      ['resume', () => r.resume()],
      ['setTimeScale', () => r.setTimeScale(0.5)],
      ['setGroupVolume', () => r.setGroupVolume('effects', -6)],
      ['setTuning', () => r.setTuning(defaultTuning)],
      ['seek', () => v.seek(0)],
    ];
    for (const [field, call] of calls) expect(call, field).toThrow(expect.objectContaining({ name: 'RalentiClosedError', field }));
    expect(() => r.createSource()).toThrow(RalentiClosedError);
    await expect(r.flush()).resolves.toBeUndefined();
    if (how === 'dispose') await expect(pending).resolves.toBeUndefined();
  });
});

describe('Ralenti flush', () => {
  it('settles waiting flushes when the processor fails and when the context closes', async () => {
    const { node, r, context } = setup();
    const a = r.flush();
    node.onprocessorerror?.();
    await expect(a).resolves.toBeUndefined();
    const listeners: (() => void)[] = [];
    const ctx = context as unknown as { addEventListener: (t: string, cb: () => void) => void; state: string };
    const { node: n2 } = setup();
    ctx.addEventListener = (_t, cb) => listeners.push(cb);
    const r2 = new Ralenti({ context, node: n2 as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 8 });
    const b = r2.flush();
    ctx.state = 'closed';
    listeners.forEach((cb) => cb());
    await expect(b).resolves.toBeUndefined();
    expect(r.closed && r2.closed).toBe(true);
  });
});

describe('Ralenti group buses and pause', () => {
  it('sends group volume, mute, solo and pausable, and reports the state it set', () => {
    const { node, r } = setup();
    expect(r.getGroupState('music')).toEqual({ volumeDb: 0, muted: false, solo: false });
    r.setGroupVolume('music', -12);
    r.setGroupMute('music', true);
    r.setGroupSolo('vehicles', true);
    r.setGroupPausable('interface', true);
    expect(r.getGroupState('music')).toEqual({ volumeDb: -12, muted: true, solo: false });
    expect(r.getGroupState('vehicles').solo).toBe(true);
    expect(node.commands('group')).toEqual([
      { type: 'group', group: 'music', volumeDb: -12 },
      { type: 'group', group: 'music', muted: true },
      { type: 'group', group: 'vehicles', solo: true },
      { type: 'group', group: 'interface', pausable: true },
    ]);
    expect(() => r.setGroupVolume('music', 30)).toThrow(expect.objectContaining({ field: 'setGroupVolume.db' }));
  });

  it('holds the main thread\'s time-scale ramp while paused, as the worklet does', () => {
    const { node, r, context } = setup(10);
    r.setTimeScale(0, { ramp: 2, easing: 'linear' });
    context.currentTime = 11;
    r.pause();
    expect(r.paused).toBe(true);
    context.currentTime = 15;
    expect(r.timeScale).toBeCloseTo(0.5, 12);
    r.resume();
    context.currentTime = 15.5;
    expect(r.timeScale).toBeCloseTo(0.25, 12);
    expect(node.commands('pause')).toEqual([{ type: 'pause' }]);
    expect(node.commands('resume')).toEqual([{ type: 'resume' }]);
  });
});

describe('Ralenti voice handles', () => {
  it('delivers voice events in order, per voice and runtime-wide, with the state following them', () => {
    const { node, r } = setup();
    const s = r.load(tone());
    const a = r.play(s, { loop: true });
    const b = r.play(s);
    const seen: string[] = [];
    const all: string[] = [];
    a.on('virtual', (e) => seen.push(`a ${e.type}`));
    a.on('ended', (e) => seen.push(`a ${e.type} ${a.state}`));
    b.on('stolen', () => seen.push(`b stolen ${b.state}`));
    r.onVoiceEvent((e: RalentiVoiceEvent) => all.push(`${e.voice.id}:${e.type}`));
    node.deliver({ type: 'voice-events', contextTime: 1, positions: new Float64Array(0), events: Float64Array.from([a.id, EVENT_VIRTUAL, 0.5, b.id, EVENT_STOLEN, 0.6]) });
    expect(a.state).toBe('virtual');
    node.deliver({ type: 'voice-events', contextTime: 1, positions: new Float64Array(0), events: Float64Array.from([a.id, EVENT_AUDIBLE, 0.7, b.id, EVENT_ENDED, 0.7, a.id, EVENT_ENDED, 0.8]) });
    expect(seen).toEqual(['a virtual', 'b stolen stopping', 'a ended ended']);
    expect(all).toEqual([`${a.id}:virtual`, `${b.id}:stolen`, `${a.id}:audible`, `${b.id}:ended`, `${a.id}:ended`]);
    expect([a.state, b.state]).toEqual(['ended', 'ended']);
    node.sent = [];
    a.stop();
    a.seek(0);
    expect(node.sent).toEqual([]); // calls on an ended voice do nothing
  });

  it('moves the reported position on by the reported speed, wrapping inside the loop', () => {
    const { node, r, context } = setup(1);
    const s = r.load(tone()); // 0.1 s
    const v = r.play(s, { loop: true, offsetSeconds: 0.02 });
    expect(v.position).toBeCloseTo(0.02, 12);
    node.deliver({ type: 'voice-events', contextTime: 2, events: new Float64Array(0), positions: Float64Array.from([v.id, 0.05, 0.5]) });
    context.currentTime = 2.02;
    expect(v.position).toBeCloseTo(0.06, 12);
    context.currentTime = 2.12; // 0.05 + 0.06 = 0.11 → wraps to 0.01
    expect(v.position).toBeCloseTo(0.01, 12);
    v.seek(0.03);
    expect(node.commands('seek')).toEqual([{ type: 'seek', voice: v.id, seconds: 0.03 }]);
    expect(v.position).toBeCloseTo(0.03, 12);
    expect(() => v.seek(0.2)).toThrow(expect.objectContaining({ field: 'seek.seconds' }));
  });
});

describe('Ralenti sources', () => {
  it('sends every live source up to maxSources, and beyond it only sources with voices, counting the rest', () => {
    const { node, r } = setup(0, 4);
    const s = r.load(tone());
    const many = Array.from({ length: 10 }, (_, i) => r.createSource().setPosition(i, 0, 0));
    r.update();
    const voiced = r.play(s, { loop: true, source: many[7] });
    const kept = r.play(s, { loop: true, source: many[2] });
    r.update();
    const [first, second] = node.commands('snapshot').map((c) => decodeSnapshot(c.data)!);
    expect(first.sources).toHaveLength(0);
    expect(second.sources.map((x) => x.id).sort()).toEqual([many[2].id, many[7].id].sort());
    expect(r.sourcesLeftOut).toBe(8);
    // When its voice ends, the source is no longer sent.
    node.deliver({ type: 'voice-events', contextTime: 0, positions: new Float64Array(0), events: Float64Array.from([voiced.id, EVENT_ENDED, 0]) });
    expect(kept.state).toBe('playing');
    r.update();
    expect(decodeSnapshot(node.commands('snapshot')[2].data)!.sources.map((x) => x.id)).toEqual([many[2].id]);
    many.filter((_, i) => i < 7 && i !== 2).forEach((x) => x.dispose());
    r.update();
    const third = decodeSnapshot(node.commands('snapshot')[3].data)!;
    expect(third.sources.map((x) => x.id)).toEqual([many[2].id, many[7].id, many[8].id, many[9].id]);
  });

  it('sends a source\'s spatial settings and orientation once per change with update(), and refuses bad fields', () => {
    const { node, r } = setup();
    const src = r.createSource().setSpatial({ refDistance: 3, coneInnerAngle: 90, coneOuterAngle: 180, coneOuterGain: 0.2 });
    r.update();
    src.setOrientation(0, 0, 1);
    r.update();
    r.update();
    expect(node.commands('source-spatial')).toEqual([
      { type: 'source-spatial', source: src.id, spatial: { refDistance: 3, coneInnerAngle: 90, coneOuterAngle: 180, coneOuterGain: 0.2 } },
      { type: 'source-spatial', source: src.id, spatial: { refDistance: 3, coneInnerAngle: 90, coneOuterAngle: 180, coneOuterGain: 0.2, orientation: { x: 0, y: 0, z: 1 } } },
    ]);
    expect(() => src.setSpatial({ coneOuterGain: 2 })).toThrow(expect.objectContaining({ field: 'setSpatial.coneOuterGain' }));
  });
});

describe('ThreeBinding on a closed runtime', () => {
  it('skips its update while its target is disposed (between a howler rebuild and retarget), instead of throwing', async () => {
    const { ThreeBinding } = await import('../../runtime/three/index');
    const { r } = setup();
    const binding = new ThreeBinding({ target: r });
    r.dispose();
    expect(r.closed).toBe(true);
    expect(() => binding.update(1)).not.toThrow();
  });
});
