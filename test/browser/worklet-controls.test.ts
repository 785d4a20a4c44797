// The game-facing controls in both hosts: the bundled worklet in Chromium's OfflineAudioContext against the engine in
// Node on the controls scene (same samples, same voice events in the same order), and the per-source distance and
// cone gains against Chromium's own PannerNode.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { workletSourceText } from '../../scripts/build-worklet.mjs';
import { browserSuiteMode, bundleForBrowser, openPage, type BrowserSession } from './browser-harness';
import { renderInNode } from './node-render';
import { controlsScene } from './controls-scene';
import type { ParityScene } from './parity-scene';
import type { PageRender, WireScene } from './parity-page';
import type { PannerCase } from './controls-page';
import { TargetMapper, createVoiceTargets, defaultTuning, type SourceSpatial } from '../../src/index';
import { Engine } from '../../src/engine/index';

const mode = browserSuiteMode();
if (mode === 'skip') console.warn('browser suite skipped: /usr/bin/chromium is absent and CI is not set (apt-get install chromium, or run .ci/run)');

/** Parity tolerance per sample, as the parity suite's. */
const TOLERANCE = 1e-5;

function toWire(s: ParityScene): WireScene {
  return { frames: s.frames, sources: s.sources, steps: s.steps, sounds: s.sounds.map((x) => ({ sampleRate: x.sampleRate, channels: x.channels.map((c) => Array.from(c)) })) };
}

function maxDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

/** Our gains for a PannerNode case: the mapper's left/right targets of a non-Doppler exempt voice at time scale 1. */
function ourGains(c: PannerCase): [number, number] {
  const mapper = new TargetMapper({ tuning: defaultTuning });
  const spatial: SourceSpatial = {
    distanceModel: c.distanceModel, refDistance: c.refDistance, maxDistance: c.maxDistance, rolloffFactor: c.rolloffFactor,
    coneInnerAngle: c.coneInnerAngle, coneOuterAngle: c.coneOuterAngle, coneOuterGain: c.coneOuterGain,
    orientation: { x: c.orientation[0], y: c.orientation[1], z: c.orientation[2] },
  };
  const zero = { x: 0, y: 0, z: 0 };
  const t = mapper.map(createVoiceTargets(), {
    timeScale: 1, group: 'interface', baseRatio: 1, gain: 1, spatial,
    listener: { position: zero, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 }, velocity: zero },
    source: { id: 1, position: { x: c.position[0], y: c.position[1], z: c.position[2] }, velocity: zero },
  });
  return [t.gain * t.left, t.gain * t.right];
}

const base: PannerCase = {
  position: [3, 0, -4], orientation: [1, 0, 0], distanceModel: 'inverse', refDistance: 1, maxDistance: 10000, rolloffFactor: 1,
  coneInnerAngle: 360, coneOuterAngle: 360, coneOuterGain: 0,
};
const cases: [string, Partial<PannerCase>][] = [
  ['inverse, ref 2, rolloff 0.5', { refDistance: 2, rolloffFactor: 0.5 }],
  ['linear, ref 1, max 20, rolloff 0.8', { distanceModel: 'linear', maxDistance: 20, rolloffFactor: 0.8 }],
  ['linear beyond max', { distanceModel: 'linear', maxDistance: 4, rolloffFactor: 0.6 }],
  ['exponential, ref 1.5, rolloff 1.7', { distanceModel: 'exponential', refDistance: 1.5, rolloffFactor: 1.7 }],
  ['inside the reference distance', { position: [0.3, 0, -0.2], refDistance: 2 }],
  ['cone facing the listener', { orientation: [-3, 0, 4], coneInnerAngle: 60, coneOuterAngle: 180, coneOuterGain: 0.2 }],
  ['cone between inner and outer', { orientation: [0, 0, 1], coneInnerAngle: 30, coneOuterAngle: 120, coneOuterGain: 0.1 }],
  ['cone facing away', { orientation: [3, 0, -4], coneInnerAngle: 60, coneOuterAngle: 180, coneOuterGain: 0.25 }],
  ['cone with an unnormalised tilted orientation, left side', { position: [-5, 1, 2], orientation: [2, 0.5, -1], coneInnerAngle: 100, coneOuterAngle: 300, coneOuterGain: 0.4 }],
  ['cone and exponential model together, behind', { position: [1, 0, 6], orientation: [0, 0, -1], distanceModel: 'exponential', rolloffFactor: 0.5, coneInnerAngle: 10, coneOuterAngle: 90, coneOuterGain: 0.5 }],
];

describe.skipIf(mode === 'skip')('game-facing controls in Chromium (OfflineAudioContext) and Node', () => {
  let session: BrowserSession | null = null;

  beforeAll(async () => {
    if (mode === 'fail') throw new Error('CI is set but /usr/bin/chromium is missing; .ci/run installs it with apt-get install -y chromium');
    const worklet = await workletSourceText({ minify: false });
    const page = await bundleForBrowser('test/browser/controls-page.ts', { __RALENTI_WORKLET_SOURCE__: JSON.stringify(worklet) });
    session = await openPage({
      '/index.html': '<!doctype html><meta charset="utf-8"><title>ralenti controls</title><script type="module" src="/page.js"></script>',
      '/page.js': page,
      '/ralenti-processor.js': worklet,
    });
    await session.page.waitForFunction(() => 'renderScene' in globalThis && 'pannerGains' in globalThis && 'renderRouted' in globalThis);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('renders pause, group volume/mute/solo, seek, per-source cone, variation and stop within 1e-5 of Node, with the same events in order', async () => {
    const scene = controlsScene();
    const browser = await session!.page.evaluate(
      ([s]) => (globalThis as unknown as { renderScene(s: WireScene, u: string | null): Promise<PageRender> }).renderScene(s, '/ralenti-processor.js'),
      [toWire(scene)] as const,
    );
    const node = renderInNode(scene);
    expect(browser.errors).toEqual([]);
    const dl = maxDiff(browser.left, node.left);
    const dr = maxDiff(browser.right, node.right);
    console.log(`controls parity: max |browser − node| left ${dl.toExponential(3)}, right ${dr.toExponential(3)}; events ${node.events.join(', ')}`);
    expect(dl).toBeLessThanOrEqual(TOLERANCE);
    expect(dr).toBeLessThanOrEqual(TOLERANCE);
    // The first one-shot ends, the muted ambience goes virtual and comes back, the solo silences (virtual) and
    // releases the others, the stopped voice ends.
    expect(node.events).toEqual(expect.arrayContaining(['4 ended', '2 virtual', '2 audible', '1 virtual', '1 audible', '2 ended']));
    expect(browser.events).toEqual(node.events);
    // The check can fail: the same scene with the pause one quantum later is far outside the tolerance.
    const late = controlsScene();
    for (const st of late.steps) if (st.actions.some((a) => a.kind === 'pause' && a.group === undefined)) st.frame += 128;
    late.steps.sort((a, b) => a.frame - b.frame);
    expect(maxDiff(browser.left, renderInNode(late).left)).toBeGreaterThan(100 * TOLERANCE);
  });

  it('sends a routed group to its own node output and the rest to the main output, each within 1e-5 of Node', async () => {
    const frames = 40 * 128;
    const samples = Array.from({ length: 48000 }, (_, i) => 0.2 * Math.sin((2 * Math.PI * 440 * i) / 48000) + 0.2 * (i / 48000));
    const page = (which: 'main' | 'music') =>
      session!.page.evaluate(
        ([x, w, n]) => (globalThis as unknown as { renderRouted(s: number[], w: string, n: number): Promise<number[][]> }).renderRouted(x, w, n),
        [samples, which, frames] as const,
      );
    const [main, music] = [await page('main'), await page('music')];
    const e = new Engine({ sampleRate: 48000, groupOutputs: ['music'] });
    const s = e.addSound([Float32Array.from(samples)], 48000);
    e.play(s, { group: 'music', loop: true, fadeInSeconds: 0 });
    e.play(s, { group: 'interface', loop: true, fadeInSeconds: 0, ratio: 0.5 });
    e.setGroupVolume('music', -6);
    const out = [new Float32Array(frames), new Float32Array(frames)];
    const route = [new Float32Array(frames), new Float32Array(frames)];
    for (let o = 0; o < frames; o += 128) e.render(out.map((c) => c.subarray(o, o + 128)), 128, [route.map((c) => c.subarray(o, o + 128))]);
    for (const ch of [0, 1]) {
      expect(maxDiff(main[ch], out[ch])).toBeLessThanOrEqual(TOLERANCE);
      expect(maxDiff(music[ch], route[ch])).toBeLessThanOrEqual(TOLERANCE);
    }
    expect(Math.max(...route[0].map(Math.abs))).toBeGreaterThan(0.05);
  });

  it.each(cases)('gives the gains of Chromium\'s equal-power PannerNode: %s', async (_name, patch) => {
    const c = { ...base, ...patch };
    const [chromium] = await session!.page.evaluate(
      ([cs]) => (globalThis as unknown as { pannerGains(c: PannerCase[]): Promise<[number, number][]> }).pannerGains(cs),
      [[c] as PannerCase[]] as const,
    );
    // Outside reference: Chromium's PannerNode (W3C Web Audio API, PannerNode distance models and sound cones;
    // docs/references.md §5 and §16). Chromium computes in single precision.
    const ours = ourGains(c);
    expect(ours[0]).toBeCloseTo(chromium[0], 5);
    expect(ours[1]).toBeCloseTo(chromium[1], 5);
    expect(Math.max(chromium[0], chromium[1])).toBeGreaterThan(0.01);
  });
});
