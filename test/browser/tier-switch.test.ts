// A resampler tier switch in Chromium's worklet, read from the worklet's own counters: with tables designed on the
// main thread the audio thread designs no table and builds no WebAssembly layout; without them (the old path) it does.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { workletSourceText } from '../../scripts/build-worklet.mjs';
import { browserSuiteMode, bundleForBrowser, openPage, type BrowserSession } from './browser-harness';
import type { SwitchResult } from './tier-switch-page';

const mode = browserSuiteMode();

describe.skipIf(mode === 'skip')('tier switch in Chromium (OfflineAudioContext, 44.1 kHz)', () => {
  let session: BrowserSession | null = null;
  const run = (tables: boolean): Promise<SwitchResult> =>
    session!.page.evaluate((t) => (globalThis as unknown as { tierSwitch(t: boolean): Promise<SwitchResult> }).tierSwitch(t), tables);

  beforeAll(async () => {
    if (mode === 'fail') throw new Error('CI is set but /usr/bin/chromium is missing; .ci/run installs it with apt-get install -y chromium');
    const worklet = await workletSourceText({ minify: false });
    session = await openPage({
      '/index.html': '<!doctype html><meta charset="utf-8"><title>ralenti tier switch</title><script type="module" src="/page.js"></script>',
      '/page.js': await bundleForBrowser('test/browser/tier-switch-page.ts'),
      '/ralenti-processor.js': worklet,
    });
    await session.page.waitForFunction(() => 'tierSwitch' in globalThis);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('switches to the high tier with no table design and no layout built on the audio thread', async () => {
    const withTables = await run(true);
    const without = await run(false);
    // The worklet's longest call is logged, not asserted (a timing on a shared machine; bench/table-install.bench.ts times the slices).
    console.log(`tier switch, longest audio-thread call (worklet clock, 1 ms steps): tables from the main thread ${withTables.peakMs} ms, designed in the worklet ${without.peakMs} ms`);
    expect(withTables.errors).toEqual([]);
    expect(withTables).toMatchObject({ tier: 'high', kernel: 'wasm-simd', designed: 0, stridesBuilt: 0, installing: 0 });
    // The counters can see table work: the processor given no tables designs both tiers and lays them out itself.
    expect(without.tier).toBe('high');
    expect(without.designed).toBeGreaterThanOrEqual(2);
    expect(without.stridesBuilt).toBeGreaterThan(0);
  });
});
