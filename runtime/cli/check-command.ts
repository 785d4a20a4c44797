// `ralenti check <scene.json>`: renders each tonal voice solo, tracks its pitch (YIN, src/analysis) and compares it
// with the heard frequency expected from the motion and tuning alone (runtime/check); writes an optional report.
import { resolve } from 'node:path';
import { loadSceneFile, renderLoadedScene, ScriptError, SCENE_BLOCK_FRAMES, evaluateMotion, type LoadedScene, type MotionSpec } from '../offline';
import { ExpectedPitch, writeReport, type MotionAt, type ReportSource } from '../check';
import { pitchErrorStats, trackPitch } from '../../src/analysis';
import { TimeFlow } from '../../src/dilation';
import { CliError, EXIT, numberOption, parseArgs, progressBar, type CliIo } from './cli-io';
import type { CliCommand } from './cli-command';

const usage = `usage: ralenti check <scene.json> [--report <file.html|file.svg>] [--tolerance-cents <n>] [options]

Renders each voice of a tone or hum sound solo with the engine, tracks its pitch over time (YIN) and
compares it with the heard frequency expected from the script's motion and tuning (Doppler formula,
maximum shift, pitch curves, smoothing). Frames are judged where the expected pitch moves less than
the tolerance within the tracker's 30 ms window; a voice passes when the 95th percentile of its
error there is within the tolerance. Exits with 1 when any voice fails.

options:
  --report <file>         write a plot of expected and measured pitch (.svg or self-contained .html)
  --tolerance-cents <n>   pass/fail tolerance, 0.1…1200 cents (default 5, about the smallest audible shift)
  --rate <Hz>             render sample rate, 8000…192000 (default: the script's)
  -q, --quiet             no progress bar
  -h, --help              this help
`;

/** Frames at the edges of a voice's life that are not judged (the fades and the tracker's window), s. */
const EDGE_SECONDS = 0.06;
/** Analysis window of the pitch tracker, s. */
const TRACK_WINDOW_SECONDS = 0.03;

function motionAt(spec: MotionSpec): MotionAt {
  return (time, out) => evaluateMotion(spec, time, out.position, out.velocity);
}

/** Time-scale curve of the script, as the renderer applies it: each key's ramp from its start time on. */
function timeScaleOf(loaded: LoadedScene): (t: number) => number {
  const keys = loaded.script.timeScale;
  const flows: TimeFlow[] = [];
  for (let k = 0; k < keys.length; k++) {
    const flow = new TimeFlow();
    for (let j = 0; j <= k; j++) flow.set({ target: keys[j].target, rampSeconds: keys[j].rampSeconds, easing: keys[j].easing, startTime: keys[j].time }, keys[j].time);
    flows.push(flow);
  }
  return (t) => {
    let k = -1;
    while (k + 1 < keys.length && keys[k + 1].time <= t) k++;
    return k < 0 ? 1 : flows[k].valueAt(t);
  };
}

async function run(args: readonly string[], io: CliIo): Promise<number> {
  const p = parseArgs(args, { report: true, 'tolerance-cents': true, rate: true, quiet: false, help: false }, { q: 'quiet', h: 'help' });
  if (p.options.has('help')) {
    io.out(usage);
    return EXIT.ok;
  }
  if (p.positionals.length !== 1) throw new CliError(p.positionals.length === 0 ? 'missing the scene script' : `expected one scene script, got ${p.positionals.length} arguments`, EXIT.usage);
  const tolerance = numberOption(p, 'tolerance-cents', 0.1, 1200, 5)!;
  const rate = numberOption(p, 'rate', 8000, 192000);
  const report = p.options.get('report');
  if (report !== undefined && (typeof report !== 'string' || !/\.(svg|html?)$/i.test(report))) throw new CliError(`--report must name a .svg or .html file, got ${JSON.stringify(report)}`, EXIT.usage);
  const scenePath = p.positionals[0];
  if (typeof report === 'string' && resolve(report) === resolve(scenePath)) throw new CliError(`refusing to overwrite the input ${scenePath}`, EXIT.usage);
  let loaded: LoadedScene;
  try {
    loaded = loadSceneFile(scenePath, rate);
  } catch (e) {
    if (e instanceof ScriptError) throw new CliError(`${scenePath}: ${e.message}`, EXIT.input);
    throw e;
  }
  const { script, sounds, tuning } = loaded;
  const sr = rate ?? script.sampleRate;
  const tonal = script.voices.map((v, i) => ({ v, i })).filter(({ v }) => sounds[v.sound].frequency !== null);
  const skipped = script.voices.length - tonal.length;
  if (tonal.length === 0) throw new CliError(`${scenePath}: no voice plays a tone or hum sound, so there is no pitch to check (noise and WAV sounds are not checked)`, EXIT.input);
  const timeScaleAt = timeScaleOf(loaded);
  const listener = motionAt(script.listener.motion);
  const results: ReportSource[] = [];
  const bar = p.options.has('quiet') ? null : progressBar(io, 'checking');
  for (let k = 0; k < tonal.length; k++) {
    const { v, i } = tonal[k];
    const rendered = renderLoadedScene(script, sounds, tuning, { sampleRate: sr, voiceFilter: (_s, j) => j === i, onProgress: bar ? (f) => bar.update((k + f) / tonal.length) : undefined });
    const mono = new Float32Array(rendered.left.length);
    for (let n = 0; n < mono.length; n++) mono[n] = 0.5 * (rendered.left[n] + rendered.right[n]);
    const emitted = sounds[v.sound].frequency! * v.ratio;
    const minHz = Math.max(20, emitted / 5);
    const maxHz = Math.min(sr / 4, emitted * 5);
    const track = trackPitch(mono, sr, { hopSeconds: 0.01, minHz, maxHz, windowSeconds: TRACK_WINDOW_SECONDS });
    const start = (Math.floor((v.start * sr) / SCENE_BLOCK_FRAMES) * SCENE_BLOCK_FRAMES) / sr;
    const expected = new ExpectedPitch({
      emittedHz: emitted,
      group: v.group ?? undefined,
      tuning,
      source: v.source === null ? null : motionAt(script.sources[v.source].motion),
      listener,
      timeScaleAt,
      startTime: start,
    }).frequencies(track.times);
    const end = v.stop ?? script.duration;
    // Judged frames: inside the voice's life, inside the tracker's range, and where the expected pitch moves less
    // than the tolerance across one analysis window (the tracker reports an average over its window).
    const half = TRACK_WINDOW_SECONDS / 2;
    const before = Float64Array.from(track.times, (t) => t - half);
    const after = Float64Array.from(track.times, (t) => t + half);
    const expect = (times: Float64Array) =>
      new ExpectedPitch({ emittedHz: emitted, group: v.group ?? undefined, tuning, source: v.source === null ? null : motionAt(script.sources[v.source].motion), listener, timeScaleAt, startTime: start }).frequencies(times);
    const lo = expect(before);
    const hi = expect(after);
    const judged = new Float64Array(track.times.length);
    for (let n = 0; n < judged.length; n++) {
      const t = track.times[n];
      const e = expected[n];
      const steady = Math.abs(1200 * Math.log2(hi[n] / lo[n])) <= tolerance;
      const inRange = e >= minHz * 1.1 && e <= maxHz / 1.1;
      judged[n] = t < start + EDGE_SECONDS || t > end - EDGE_SECONDS || !steady || !inRange ? NaN : e;
    }
    const stats = pitchErrorStats(judged, track.frequencies);
    const passed = stats.count > 0 && stats.p95Cents <= tolerance;
    const name = `voice ${i} (${v.sound}${v.source ? ` on ${v.source}` : ''})`;
    results.push({ name, times: track.times, expectedHz: judged, measuredHz: track.frequencies, stats, passed, note: stats.count === 0 ? 'no pitch found where one was expected' : undefined });
  }
  bar?.done();
  const lines = results.map(
    (r) => `${r.passed ? 'PASS' : 'FAIL'}  ${r.name}: median ${r.stats.medianCents.toFixed(2)}, p95 ${r.stats.p95Cents.toFixed(2)}, max ${r.stats.maxCents.toFixed(2)} cents over ${r.stats.count} frames`,
  );
  io.out(`${lines.join('\n')}\n`);
  if (skipped > 0) io.out(`(${skipped} voice(s) of noise or WAV sounds not checked)\n`);
  if (typeof report === 'string') {
    const times = results[0].times;
    const values = Float64Array.from(times, (t) => timeScaleAt(t));
    try {
      writeReport(report, { title: scenePath, toleranceCents: tolerance, sources: results, timeScale: { times, values } });
    } catch (e) {
      throw new CliError(`cannot write ${report}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`, EXIT.output);
    }
    io.out(`report written to ${report}\n`);
  }
  const failed = results.filter((r) => !r.passed).length;
  io.out(failed === 0 ? `all ${results.length} voice(s) within ${tolerance} cents\n` : `${failed} of ${results.length} voice(s) outside ${tolerance} cents\n`);
  return failed === 0 ? EXIT.ok : EXIT.failed;
}

/** The `check` command. */
export const checkCommand: CliCommand = { name: 'check', summary: 'check heard pitch against the Doppler and time-scale expectation', usage, run };
