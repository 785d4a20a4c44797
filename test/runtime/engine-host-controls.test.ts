// The audio-thread side of the controls: control commands decoded and applied, voice events posted in order with
// main-thread handles (only when there are some), refused plays reported as ended, stopping voices keep their handle.
import { describe, expect, it } from 'vitest';
import { EngineHost } from '../../runtime/worklet/engine-host';
import { decodeCommand, type Report } from '../../runtime/protocol';
import { EVENT_ENDED, EVENT_STOLEN, voiceEventName } from '../../src/engine';
import { defaultTuning } from '../../src/tuning/index';

function host(capacity = 4) {
  const reports: Report[] = [];
  const h = new EngineHost({
    sampleRate: 48000,
    startContextTime: 2,
    processorOptions: { capacity, maxSounds: 8, tuning: defaultTuning, statsIntervalSeconds: 10 },
    post: (r) => reports.push(r),
  });
  const out = () => [new Float32Array(128), new Float32Array(128)];
  const tone = new Float32Array(4800).map((_, i) => 0.3 * Math.sin((2 * Math.PI * 440 * i) / 48000));
  h.handle({ type: 'add-sound', sound: 1, channels: [tone], sampleRate: 48000 });
  return { h, reports, out };
}

const events = (reports: Report[]) =>
  reports.flatMap((r) => (r.type === 'voice-events' ? Array.from({ length: r.events.length / 3 }, (_, k) => `${r.events[3 * k]} ${voiceEventName(r.events[3 * k + 1])}`) : []));

describe('EngineHost controls', () => {
  it('posts voice events with main-thread handles in order, and nothing in blocks without events', () => {
    const { h, reports, out } = host(1);
    h.handle({ type: 'play', voice: 10, sound: 1, options: { group: 'effects', loop: true } });
    for (let b = 0; b < 5; b++) h.process(out());
    expect(reports.filter((r) => r.type === 'voice-events')).toEqual([]);
    h.handle({ type: 'play', voice: 11, sound: 1, options: { group: 'effects', loop: true } });
    for (let b = 0; b < 10; b++) h.process(out());
    h.handle({ type: 'stop', voice: 11, fadeSeconds: 0 });
    h.process(out());
    expect(events(reports)).toEqual(['10 stolen', '10 ended', '11 ended']);
    const ev = reports.find((r) => r.type === 'voice-events');
    if (ev?.type === 'voice-events') expect(ev.events[1]).toBe(EVENT_STOLEN);
    expect(h.mappedVoices).toBe(0);
  });

  it('reports a play the engine refused as ended', () => {
    const { h, reports, out } = host(1);
    h.handle({ type: 'play', voice: 1, sound: 1, options: { group: 'effects', loop: true, priority: 200 } });
    h.handle({ type: 'play', voice: 2, sound: 1, options: { group: 'effects', loop: true, priority: 10 } });
    h.process(out());
    const r = reports.find((x) => x.type === 'voice-events');
    expect(r?.type === 'voice-events' && Array.from(r.events.slice(0, 2))).toEqual([2, EVENT_ENDED]);
  });

  it('keeps a stopping voice\'s handle in the monitors while it fades, and reports positions on sync', () => {
    const { h, reports, out } = host();
    h.handle({ type: 'play', voice: 7, sound: 1, options: { group: 'interface', loop: true } });
    for (let b = 0; b < 4; b++) h.process(out());
    h.handle({ type: 'stop', voice: 7, fadeSeconds: 0.5 });
    h.process(out());
    h.sendStats();
    const stats = reports.filter((r) => r.type === 'stats').at(-1);
    expect(stats?.type === 'stats' && stats.voices.map((v) => v.voice)).toEqual([7]);
    h.handle({ type: 'sync', id: 1 });
    const pos = reports.filter((r) => r.type === 'voice-events').at(-1);
    // 5 blocks at ratio 1 (48 kHz sound): 640 frames = 1/75 s of source time, moving at 1 s per s.
    expect(pos?.type === 'voice-events' && Array.from(pos.positions)).toEqual([7, 640 / 48000, 1]);
  });

  it('applies pause, group and seek commands by main-thread handle', () => {
    const { h, out } = host();
    h.handle({ type: 'play', voice: 3, sound: 1, options: { group: 'effects', loop: true } });
    h.handle({ type: 'group', group: 'effects', volumeDb: -6, solo: true });
    expect(h.engine.getGroupState('effects')).toEqual({ volumeDb: -6, muted: false, solo: true, paused: false });
    h.handle({ type: 'pause' });
    for (let b = 0; b < 10; b++) h.process(out());
    h.handle({ type: 'seek', voice: 3, seconds: 0.05 });
    h.process(out());
    // Held by the pause at level 0, the seek applies at once.
    const engineVoice = h.handles.voiceOf(3)!;
    expect(h.engine.voicePosition(engineVoice)).toBeCloseTo(0.05, 9);
    expect(h.errors).toBe(0);
  });
});

describe('decodeCommand for controls', () => {
  it.each([
    [{ type: 'pause' }, null],
    [{ type: 'resume', group: 'music' }, null],
    [{ type: 'pause', group: 3 }, 'pause.group: expected a string'],
    [{ type: 'group', group: 'music', volumeDb: -3, muted: true }, null],
    [{ type: 'group', group: 'music', solo: 'yes' }, 'group: muted, solo and pausable must be booleans'],
    [{ type: 'seek', voice: 1, seconds: 0.5 }, null],
    [{ type: 'seek', voice: -1, seconds: 0.5 }, 'seek.voice: expected a handle'],
    [{ type: 'source-spatial', source: 1, spatial: null }, null],
    [{ type: 'source-spatial', source: 1, spatial: 3 }, 'source-spatial.spatial: expected an object or null'],
  ])('decodes %j (problem: %s)', (data, problem) => {
    const c = decodeCommand(data);
    if (problem === null) expect(c).toEqual(data);
    else expect(c).toBe(problem);
  });
});
