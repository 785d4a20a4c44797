// The worklet frees its engine on close, seen from the main thread: Ralenti.dispose() resolves with the audio thread's
// last report (engine disposed, module memory given back), in Chromium's AudioWorklet: offline renders, and a
// suspended real-time context, where process() does not run but the close is still answered.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { workletSourceText } from '../../scripts/build-worklet.mjs';
import { browserSuiteMode, bundleForBrowser, openPage, type BrowserSession } from './browser-harness';
import type { CloseResult } from './close-page';

const mode = browserSuiteMode();

/** Bytes of an engine's own regions in module memory: voice scratch and mix bus (docs/memory.md). */
const ENGINE_REGIONS = 2048;

describe.skipIf(mode === 'skip')('closing the worklet in Chromium', () => {
  let session: BrowserSession | null = null;

  beforeAll(async () => {
    if (mode === 'fail') throw new Error('CI is set but /usr/bin/chromium is missing; .ci/run installs it with apt-get install -y chromium');
    const worklet = await workletSourceText({ minify: false });
    session = await openPage({
      '/index.html': '<!doctype html><meta charset="utf-8"><title>ralenti close</title><script type="module" src="/page.js"></script>',
      '/page.js': await bundleForBrowser('test/browser/close-page.ts'),
      '/ralenti-processor.js': worklet,
    });
    await session.page.waitForFunction(() => 'closeCycles' in globalThis);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('answers every dispose with its engine disposed and its module memory back, and is silent after the close', async () => {
    const r = await session!.page.evaluate(() => (globalThis as unknown as { closeCycles(): Promise<CloseResult> }).closeCycles());
    expect(r.errors).toEqual([]);
    expect(r.reports).toHaveLength(4);
    for (const report of r.reports) {
      expect(report).toMatchObject({ type: 'closed', engineDisposed: true });
      // Each engine gave back at least its scratch, mix bus and resident sound (the tables installed for it come on top).
      expect(report!.kernel!.bytesReleased).toBeGreaterThanOrEqual(r.soundBytes + ENGINE_REGIONS);
    }
    // The three engines of the offline context's realm leave the same bytes in use behind: nothing accumulates.
    const inUse = r.reports.slice(0, 3).map((x) => x!.kernel!.bytesInUse);
    expect(new Set(inUse).size).toBe(1);
    // The processor ended at the close: audible before it, silent after it.
    expect(r.peakBefore).toBeGreaterThan(0.1);
    expect(r.peakAfter).toBe(0);
    expect(r.realtimeState).toBe('suspended');
    console.log(`close: released ${r.reports.map((x) => x!.kernel!.bytesReleased).join(', ')} bytes; in use after ${inUse[0]}; real-time context ${r.realtimeState}`);
  });
});
