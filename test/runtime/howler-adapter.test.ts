import { describe, expect, it } from 'vitest';
import { Ralenti, RalentiOptionError, defaultTuning } from '../../runtime/index';
import { HowlerBridge, HowlRateDriver, extensionOf, groupSpeed } from '../../runtime/howler/index';
import { TargetMapper, createVoiceTargets } from '../../src/dilation/index';
import { FakeWorkletNode } from './fake-worklet-node';
import { fakeHowl, fakeHowler } from './fake-howler';

function bridge(howler = fakeHowler()) {
  const nodes: FakeWorkletNode[] = [];
  const contexts: BaseAudioContext[] = [];
  const fetched: string[] = [];
  const b = new HowlerBridge({
    howler,
    create: async (context) => {
      const node = new FakeWorkletNode();
      nodes.push(node);
      contexts.push(context);
      return new Ralenti({ context, node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 8 });
    },
    fetch: async (url) => {
      fetched.push(url);
      return { ok: !url.includes('missing'), status: url.includes('missing') ? 404 : 200, arrayBuffer: async () => new ArrayBuffer(64) };
    },
  });
  return { b, howler, nodes, contexts, fetched };
}

describe('HowlerBridge', () => {
  it('adopts Howler.ctx only after howler set it up, routes into masterGain and turns autoSuspend off', async () => {
    const { b, howler, nodes, contexts } = bridge();
    expect(howler.ctx).toBeNull();
    const r = await b.start();
    expect(howler.setups).toBe(1);
    expect(contexts[0]).toBe(howler.ctx);
    expect(nodes[0].connectedTo).toEqual([howler.masterGain]);
    expect(howler.autoSuspend).toBe(false);
    expect(b.ralenti).toBe(r);
    b.stop();
    expect(howler.autoSuspend).toBe(true);
  });

  it('refuses to start when howler is not using Web Audio', async () => {
    const { b } = bridge(fakeHowler({ usingWebAudio: false }));
    await expect(b.start()).rejects.toBeInstanceOf(RalentiOptionError);
  });

  it('rebuilds on the new context after Howler.unload() and reloads sounds under the same handles', async () => {
    const { b, howler, nodes, contexts } = bridge();
    await b.start();
    const sound = await b.loadSrc(['a.webm', 'a.ogg']);
    expect(b.check()).toBe(false);
    const rebuilt: Ralenti[] = [];
    b.onRebuild((r) => rebuilt.push(r));
    howler.unload();
    expect(b.check()).toBe(true);
    await Promise.resolve();
    const r2 = await b.start();
    await Promise.resolve();
    expect(contexts[1]).toBe(howler.ctx);
    expect(nodes[0].closed).toBe(true);
    expect(nodes[1].connectedTo).toEqual([howler.masterGain]);
    expect(nodes[1].commands('add-sound').map((c) => c.sound)).toEqual([sound.id]);
    expect(rebuilt).toEqual([r2]);
    expect(b.rebuilds).toBe(1);
    expect(howler.autoSuspend).toBe(false);
  });

  it('fetches the first playable src and decodes it on howler\'s context', async () => {
    const { b, howler, fetched, nodes } = bridge();
    const sound = await b.loadSrc(['music.webm', 'music.ogg?v=2', 'music.mp3']);
    expect(fetched).toEqual(['music.ogg?v=2']);
    expect((howler.ctx as unknown as { decoded: number[] }).decoded).toEqual([64]);
    expect(sound).toMatchObject({ sampleRate: 44100, frames: 48000 });
    expect(nodes[0].commands('add-sound')).toHaveLength(1);
  });

  it.each([
    [['a.ogg'], { html5: true }, 'howl.html5'],
    [['a.webm'], {}, 'howl.src'],
    [[], {}, 'howl.src'],
  ])('refuses src %j with options %j naming %s', async (src, options, field) => {
    const { b } = bridge();
    await expect(b.loadSrc(src, options)).rejects.toMatchObject({ field });
  });

  it('uses the Howl\'s format list for URLs without an extension, and reports HTTP failures', async () => {
    const { b, fetched } = bridge();
    await b.loadSrc(['blob:sound-1'], { format: ['ogg'] });
    expect(fetched).toEqual(['blob:sound-1']);
    await expect(b.loadSrc('missing.ogg')).rejects.toThrow(/404/);
  });

  it.each([
    ['a/b/c.OGG', 'ogg'],
    ['c.mp3?x=1#t', 'mp3'],
    ['data:audio/wav;base64,AAAA', 'wav'],
    ['noext', null],
  ])('reads the extension of %s as %s', (url, ext) => {
    expect(extensionOf(url)).toBe(ext);
  });
});

describe('HowlRateDriver (light mode)', () => {
  it('calls howl.rate at most 30 times per second on a continuous glide', () => {
    const howl = fakeHowl();
    const d = new HowlRateDriver({ howl, id: 7 });
    // A 2-second glide from 1 down an octave, offered at 240 Hz.
    for (let i = 0; i <= 480; i++) d.update(Math.pow(2, -i / 480), i / 240);
    expect(d.calls).toBeLessThanOrEqual(2 * 30 + 1);
    expect(d.calls).toBeGreaterThan(30);
    expect(howl.calls.every(([, id]) => id === 7)).toBe(true);
    for (let k = 1; k < howl.calls.length; k++) expect(howl.calls[k][0]).toBeLessThan(howl.calls[k - 1][0]);
  });

  it('sends nothing for changes below the threshold', () => {
    const howl = fakeHowl();
    const d = new HowlRateDriver({ howl, id: 1, thresholdCents: 10 });
    for (let i = 0; i < 100; i++) d.update(Math.pow(2, 5 / 1200), i); // 5 cents, once a second
    expect(howl.calls).toEqual([]);
    d.update(Math.pow(2, 20 / 1200), 200);
    expect(howl.calls).toHaveLength(1);
  });

  it('clamps to the engine range and ignores non-finite ratios', () => {
    const howl = fakeHowl();
    const d = new HowlRateDriver({ howl, id: 1 });
    expect(d.update(NaN, 0)).toBe(false);
    d.update(100, 1);
    expect(howl.calls).toEqual([[4, 1]]);
  });

  it.each([[0], [31], [NaN]])('refuses maxHz %d', (maxHz) => {
    expect(() => new HowlRateDriver({ howl: fakeHowl(), id: 1, maxHz })).toThrow(/maxHz/);
  });

  it('maps a group and time scale to the tuning\'s speed (exempt groups stay at 1, unknown ones follow effects)', () => {
    // The built-in effects pitch curve is the identity (keys (0, 0) and (4, 4)): speed equals the time scale.
    expect(defaultTuning.groups.effects.pitch.keys).toEqual([{ x: 0, y: 0 }, { x: 4, y: 4 }]);
    for (const s of [1, 0.5, 0.25]) expect(groupSpeed(defaultTuning, 'effects', s)).toBeCloseTo(s, 9);
    expect(groupSpeed(defaultTuning, 'interface', 0.25)).toBe(1);
  });

  it('gives an unknown group the speed the engine gives it (the effects group, as TargetMapper maps it)', () => {
    const mapper = new TargetMapper({ tuning: defaultTuning });
    const listener = { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 }, velocity: { x: 0, y: 0, z: 0 } };
    for (const timeScale of [0.1, 0.25, 0.5, 0.75]) {
      const t = mapper.map(createVoiceTargets(), { timeScale, group: 'no-such-group', baseRatio: 1, gain: 1, listener, source: null });
      expect(t.ratio).not.toBe(1);
      expect(groupSpeed(defaultTuning, 'no-such-group', timeScale)).toBeCloseTo(t.ratio, 9);
    }
  });
});
