// The bundled worklet in Chromium's OfflineAudioContext against the engine in Node: same scene, same samples.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { workletSourceText } from '../../scripts/build-worklet.mjs';
import { browserSuiteMode, bundleForBrowser, openPage, type BrowserSession } from './browser-harness';
import { renderInNode } from './node-render';
import { parityScene, type ParityScene } from './parity-scene';
import type { PageRender, WireScene } from './parity-page';

const mode = browserSuiteMode();
if (mode === 'skip') console.warn('browser suite skipped: /usr/bin/chromium is absent and CI is not set (apt-get install chromium, or run .ci/run)');

/** Parity tolerance per sample, from the acceptance criterion. */
const TOLERANCE = 1e-5;

function toWire(s: ParityScene): WireScene {
  return { frames: s.frames, sources: s.sources, steps: s.steps, sounds: s.sounds.map((x) => ({ sampleRate: x.sampleRate, channels: x.channels.map((c) => Array.from(c)) })) };
}

function maxDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

function peak(a: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i]));
  return m;
}

describe.skipIf(mode === 'skip')('worklet in Chromium (OfflineAudioContext)', () => {
  let session: BrowserSession | null = null;
  const scene = parityScene(1.5);
  const render = (workletUrl: string | null): Promise<PageRender> =>
    session!.page.evaluate(
      ([s, u]) => (globalThis as unknown as { renderScene(s: WireScene, u: string | null): Promise<PageRender> }).renderScene(s, u),
      [toWire(scene), workletUrl] as const,
    );

  beforeAll(async () => {
    if (mode === 'fail') throw new Error('CI is set but /usr/bin/chromium is missing; .ci/run installs it with apt-get install -y chromium');
    const worklet = await workletSourceText({ minify: false });
    const page = await bundleForBrowser('test/browser/parity-page.ts', { __RALENTI_WORKLET_SOURCE__: JSON.stringify(worklet) });
    session = await openPage({
      '/index.html': '<!doctype html><meta charset="utf-8"><title>ralenti parity</title><script type="module" src="/page.js"></script>',
      '/page.js': page,
      '/ralenti-processor.js': worklet,
    });
    await session.page.waitForFunction(() => 'renderScene' in globalThis);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('renders the parity scene within 1e-5 per sample of the Node engine', async () => {
    const browser = await render('/ralenti-processor.js');
    const node = renderInNode(scene);
    expect(browser.errors).toEqual([]);
    // Both sides run the WebAssembly SIMD resampler kernel (the module is inlined in the worklet bundle).
    expect(browser.kernel).toBe('wasm-simd');
    expect(node.kernel).toBe('wasm-simd');
    expect(browser.left).toHaveLength(scene.frames);
    // The comparison means something only if the scene is audible in both channels.
    expect(peak(node.left)).toBeGreaterThan(0.05);
    expect(peak(node.right)).toBeGreaterThan(0.05);
    const dl = maxDiff(browser.left, node.left);
    const dr = maxDiff(browser.right, node.right);
    console.log(`parity: max |browser − node| left ${dl.toExponential(3)}, right ${dr.toExponential(3)}; Chromium offline render ${browser.renderMs.toFixed(1)} ms for ${(scene.frames / 48000).toFixed(2)} s`);
    expect(dl).toBeLessThanOrEqual(TOLERANCE);
    expect(dr).toBeLessThanOrEqual(TOLERANCE);
    // The check can fail: the same scene with its steps one render quantum late is far outside the tolerance.
    const late = renderInNode({ ...scene, steps: scene.steps.map((st) => ({ ...st, frame: st.frame + 128 })) });
    expect(Math.max(maxDiff(browser.left, late.left), maxDiff(browser.right, late.right))).toBeGreaterThan(1000 * TOLERANCE);
  });

  it('renders the parity scene on the wasm kernel in Chromium within 1e-5 of the TypeScript reference kernel in Node', async () => {
    const browser = await render('/ralenti-processor.js');
    const reference = renderInNode(scene, 'typescript');
    expect([browser.kernel, reference.kernel]).toEqual(['wasm-simd', 'typescript']);
    expect(maxDiff(browser.left, reference.left)).toBeLessThanOrEqual(TOLERANCE);
    expect(maxDiff(browser.right, reference.right)).toBeLessThanOrEqual(TOLERANCE);
  });

  it('renders the same samples with the inlined Blob-URL worklet as with the worklet file', async () => {
    const fromFile = await render('/ralenti-processor.js');
    const inline = await render(null);
    expect(inline.errors).toEqual([]);
    expect(maxDiff(inline.left, fromFile.left)).toBe(0);
    expect(maxDiff(inline.right, fromFile.right)).toBe(0);
  });

  it('reports a malformed command from the audio thread and keeps playing', async () => {
    const r = await session!.page.evaluate(() =>
      (globalThis as unknown as { probeBadCommand(): Promise<{ errors: string[]; statsErrors: number; activeVoices: number; peakAfter: number }> }).probeBadCommand(),
    );
    expect(r.errors).toEqual(['command: play.voice: expected a handle']);
    expect(r.statsErrors).toBe(1);
    expect(r.activeVoices).toBe(1);
    expect(r.peakAfter).toBeGreaterThan(0.05);
  });
});
