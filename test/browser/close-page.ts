// Browser side of the close suite: runtimes disposed in Chromium, each awaiting the worklet's last report (engine
// disposed, module memory back), during an offline render (the output after the close must be silent) and on a
// suspended real-time context (no process() calls, messages still handled).
import { createRalenti, type ClosedReport } from '../../runtime/index';

/** What the page returns to the test. */
export interface CloseResult {
  /** Each disposed runtime's answer, in order (null: none came within the page's wait). */
  reports: (ClosedReport | null)[];
  /** Bytes of the sound each runtime made resident (4 per frame and channel). */
  soundBytes: number;
  /** Largest |sample| before the close and after it (from 10 ms after), of the offline render. */
  peakBefore: number;
  peakAfter: number;
  /** Context state when the real-time runtime was disposed. */
  realtimeState: string;
  errors: string[];
}

const RATE = 48000;
/** Longest wait for an answer, ms (a guard against a hang; a test failure reads null). */
const WAIT_MS = 10_000;

const within = <T>(p: Promise<T>): Promise<T | null> => Promise.race([p, new Promise<null>((ok) => setTimeout(() => ok(null), WAIT_MS))]);

function tone(seconds: number): Float32Array {
  return new Float32Array(Math.round(seconds * RATE)).map((_, i) => 0.25 * Math.sin((2 * Math.PI * 440 * i) / RATE));
}

/** Three runtimes opened and disposed in turn in one offline context, the last one during its render. */
async function closeCycles(): Promise<CloseResult> {
  const errors: string[] = [];
  const reports: (ClosedReport | null)[] = [];
  const sound = tone(0.5);
  const ctx = new OfflineAudioContext(2, RATE, RATE);
  for (let i = 0; i < 2; i++) {
    const r = await createRalenti(ctx, { workletUrl: '/ralenti-processor.js' });
    r.onError((e) => errors.push(`${e.where}: ${e.message}`));
    r.play(r.load({ channels: [sound, sound] , sampleRate: RATE }), { group: 'interface', loop: true });
    await r.flush();
    reports.push(await within(r.dispose()));
  }
  const r = await createRalenti(ctx, { workletUrl: '/ralenti-processor.js' });
  r.connect(ctx.destination);
  r.onError((e) => errors.push(`${e.where}: ${e.message}`));
  r.play(r.load({ channels: [sound, sound], sampleRate: RATE }), { group: 'interface', loop: true, fadeInSeconds: 0 });
  const closed = ctx.suspend(0.5).then(async () => {
    reports.push(await within(r.dispose()));
    await ctx.resume();
  });
  await r.flush();
  const out = await ctx.startRendering();
  await closed;
  const left = out.getChannelData(0);
  let peakBefore = 0;
  let peakAfter = 0;
  for (let i = 0; i < left.length; i++) {
    if (i < 0.5 * RATE) peakBefore = Math.max(peakBefore, Math.abs(left[i]));
    else if (i >= 0.51 * RATE) peakAfter = Math.max(peakAfter, Math.abs(left[i]));
  }
  // A suspended real-time context: process() does not run, the close is still answered (from the message handler).
  const live = new AudioContext({ sampleRate: RATE });
  const lr = await createRalenti(live, { workletUrl: '/ralenti-processor.js' });
  lr.play(lr.load({ channels: [sound, sound], sampleRate: RATE }), { group: 'interface', loop: true });
  await lr.flush();
  await live.suspend();
  const realtimeState = live.state;
  reports.push(await within(lr.dispose()));
  await live.close();
  return { reports, soundBytes: 4 * 2 * sound.length, peakBefore, peakAfter, realtimeState, errors };
}

Object.assign(globalThis, { closeCycles });
