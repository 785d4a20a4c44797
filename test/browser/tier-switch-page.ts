// Browser side of the tier-switch suite: an OfflineAudioContext at 44.1 kHz plays a tone on the standard tier,
// switches to the high tier 0.1 s in, and returns what the worklet counted (table work, longest call, tier in use).
import { Ralenti, createRalenti, defaultTuning, serializeTuning, PROCESSOR_NAME } from '../../runtime/index';

/** What the page returns to the test. */
export interface SwitchResult {
  tier: string;
  kernel: string;
  designed: number;
  stridesBuilt: number;
  installing: number;
  /** Longest single audio-thread call in the report interval that held the switch, ms (worklet clock). */
  peakMs: number;
  errors: string[];
}

const RATE = 44100;

/** Renders the switch; `mainThreadTables` false builds the node without tables (the processor then designs its own). */
async function tierSwitch(mainThreadTables: boolean): Promise<SwitchResult> {
  const ctx = new OfflineAudioContext(2, RATE, RATE);
  let r: Ralenti;
  if (mainThreadTables) {
    r = await createRalenti(ctx, { workletUrl: '/ralenti-processor.js', statsIntervalSeconds: 0.05 });
  } else {
    await ctx.audioWorklet.addModule('/ralenti-processor.js');
    const node = new AudioWorkletNode(ctx, PROCESSOR_NAME, {
      numberOfInputs: 0, numberOfOutputs: 1, outputChannelCount: [2],
      processorOptions: { capacity: 8, maxSounds: 4, tuning: defaultTuning, statsIntervalSeconds: 0.05 },
    });
    r = new Ralenti({ context: ctx, node, tuning: defaultTuning, capacity: 8 });
  }
  r.connect(ctx.destination);
  const errors: string[] = [];
  r.onError((e) => errors.push(`${e.where}: ${e.message}`));
  const tone = new Float32Array(RATE).map((_, i) => 0.25 * Math.sin((2 * Math.PI * 440 * i) / RATE));
  r.play(r.load({ channels: [tone], sampleRate: RATE }), { group: 'interface', loop: true, ratio: 1.7 });
  let peakMs = 0;
  let lastStatsTime = 0;
  r.node.port.addEventListener('message', (e: MessageEvent) => {
    const m = e.data as { type: string; contextTime?: number; load?: { peakMs?: number } };
    if (m.type !== 'stats') return;
    if (m.load?.peakMs !== undefined) peakMs = Math.max(peakMs, m.load.peakMs);
    if (m.contextTime !== undefined) lastStatsTime = Math.max(lastStatsTime, m.contextTime);
  });
  const switched = ctx.suspend(0.1).then(async () => {
    const t = JSON.parse(serializeTuning(defaultTuning));
    t.resampler.tier = 'high';
    r.setTuning(t);
    await r.flush();
    await ctx.resume();
  });
  await r.flush();
  await ctx.startRendering();
  await switched;
  await r.flush();
  // The rendered context is closed, so flush() no longer waits for the worklet; the stats it posted near the end of the
  // render may still be queued on the main thread (seen on a loaded machine): wait for the last report (one every
  // 0.05 s of audio, so one at or after 0.9 s), up to 5 s.
  for (let waited = 0; lastStatsTime < 0.9 && waited < 5000; waited += 10) await new Promise((done) => setTimeout(done, 10));
  const w = r.tableWork;
  const result = { tier: String(r.stats.tier), kernel: String(r.stats.kernel), designed: w?.designed ?? -1, stridesBuilt: w?.stridesBuilt ?? -1, installing: w?.installing ?? -1, peakMs, errors };
  r.dispose();
  return result;
}

Object.assign(globalThis, { tierSwitch });
