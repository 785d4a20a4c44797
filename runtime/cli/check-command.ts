// `ralenti check <scene.json>`: judges heard pitch against the pitch expected from the script's motion and tuning
// alone (runtime/check) — on the audio the browser played (--audio) or on an offline re-render — and writes a report.
import { dirname, extname, resolve } from 'node:path';
import { loadSceneFile, ScriptError, type LoadedScene } from '../offline';
import { checkAudio, checkScene, checkLimitDefaults, renderReportHtml, renderReportSvg, svgToPng, type CheckResult } from '../check';
import { CliError, EXIT, numberOption, parseArgs, progressBar, type CliIo } from './cli-io';
import { readWavFile, refuseOverwrite, SafeFileWriter } from './cli-files';
import type { CliCommand } from './cli-command';

const usage = `usage: ralenti check <scene.json> [--audio <recording.wav>] [--report <file.svg|.html|.png>] [options]

Judges the heard pitch of every voice of a tone or hum sound against the pitch expected from the
script's motion and tuning alone: the Doppler model the tuning asks for (emission-time propagation, or
the same-instant formula), its maximum shift and pitch curves at the script's time scale. Smoothing or
lag in the engine is reported as error, never expected. Every voiced frame is judged, closest approach
included; frames that cannot be judged are listed with their reason.

With --audio it judges that recording (the mix the page captured with the script, time 0 = the
script's time 0); without it, an offline re-render of the script by the engine, one voice at a time.
Exits 0 when every voice passes, 1 when one fails, 2 bad arguments, 3 bad input, 4 cannot write,
5 internal error.

options:
  --audio <file.wav>       judge this recording instead of a re-render
  --report <file>          write the plot: .svg, self-contained .html, or .png
  --p95-cents <n>          largest 95th percentile error, 0.1…1200 cents (default ${checkLimitDefaults.p95Cents})
  --tolerance-cents <n>    the same as --p95-cents
  --max-cents <n>          largest single-frame error, 0.1…2400 cents (default ${checkLimitDefaults.maxCents})
  --closest-share <n>      smallest judged share within ±${checkLimitDefaults.closestApproachSeconds} s of closest approach, 0…1 (default ${checkLimitDefaults.closestApproachShare})
  --rate <Hz>              re-render sample rate, 8000…192000 (default: the script's)
  -q, --quiet              no progress bar
  -h, --help               this help
`;

const fmt = (v: number, d = 2): string => (Number.isFinite(v) ? v.toFixed(d) : '–');

async function run(args: readonly string[], io: CliIo): Promise<number> {
  const p = parseArgs(
    args,
    { audio: true, report: true, 'tolerance-cents': true, 'p95-cents': true, 'max-cents': true, 'closest-share': true, rate: true, quiet: false, help: false },
    { q: 'quiet', h: 'help' },
  );
  if (p.options.has('help')) {
    io.out(usage);
    return EXIT.ok;
  }
  if (p.positionals.length !== 1) throw new CliError(p.positionals.length === 0 ? 'missing the scene script' : `expected one scene script, got ${p.positionals.length} arguments`, EXIT.usage);
  const p95 = numberOption(p, 'p95-cents', 0.1, 1200) ?? numberOption(p, 'tolerance-cents', 0.1, 1200, checkLimitDefaults.p95Cents)!;
  const max = numberOption(p, 'max-cents', 0.1, 2400, Math.max(checkLimitDefaults.maxCents, p95))!;
  const share = numberOption(p, 'closest-share', 0, 1, checkLimitDefaults.closestApproachShare)!;
  const rate = numberOption(p, 'rate', 8000, 192000);
  if (rate !== undefined && !Number.isInteger(rate)) throw new CliError(`--rate must be a whole number of hertz, got ${p.options.get('rate')}`, EXIT.usage);
  const report = p.options.get('report');
  const audioPath = p.options.get('audio');
  if (report !== undefined && (typeof report !== 'string' || !/\.(svg|html?|png)$/i.test(report))) throw new CliError(`--report must name a .svg, .html or .png file, got ${JSON.stringify(report)}`, EXIT.usage);
  if (audioPath !== undefined && typeof audioPath !== 'string') throw new CliError('--audio needs a WAV file', EXIT.usage);
  const scenePath = p.positionals[0];
  if (typeof report === 'string') refuseOverwrite(report, audioPath ? [scenePath, audioPath] : [scenePath]);
  let loaded: LoadedScene;
  try {
    loaded = loadSceneFile(scenePath, rate);
  } catch (e) {
    if (e instanceof ScriptError) throw new CliError(`${scenePath}: ${e.message}`, EXIT.input);
    throw e;
  }
  const audio = audioPath ? readWavFile(audioPath) : null;
  if (audio && audio.channels[0].length < 0.5 * loaded.script.duration * audio.sampleRate) {
    throw new CliError(`${audioPath}: holds ${(audio.channels[0].length / audio.sampleRate).toFixed(2)} s of audio for a ${loaded.script.duration.toFixed(2)} s script; record the audio with the script`, EXIT.input);
  }
  const tonal = loaded.script.voices.filter((v) => loaded.sounds[v.sound].frequency !== null).length;
  if (tonal === 0) throw new CliError(`${scenePath}: no voice plays a tone or hum sound, so there is no pitch to check (noise and WAV sounds are not checked)`, EXIT.input);
  const bar = p.options.has('quiet') ? null : progressBar(io, 'checking');
  let checked: CheckResult;
  try {
    const options = { limits: { p95Cents: p95, maxCents: max, closestApproachShare: share }, sampleRate: rate, onProgress: bar ? (f: number) => bar.update(f) : undefined };
    checked = audio ? checkAudio(loaded, audio, options) : checkScene(loaded, options);
  } catch (e) {
    bar?.done();
    throw new CliError(`internal error while checking: ${(e as Error).stack ?? String(e)}`, EXIT.internal);
  }
  bar?.done();
  io.out(`judged ${checked.mode === 'recorded-audio' ? `the recording ${audioPath}` : 'an offline re-render of the script'}\n`);
  for (const r of checked.sources) {
    const f = r.figures;
    const ca = Number.isNaN(f.closestApproachShare) ? '' : `, ${fmt(f.closestApproachShare * 100, 0)} % near closest approach at ${fmt(r.closestApproach!)} s`;
    io.out(`${r.passed ? 'PASS' : 'FAIL'}  ${r.name} [${r.model} Doppler]: median ${fmt(f.medianCents)}, p95 ${fmt(f.p95Cents)}, max ${fmt(f.maxCents)} cents at ${fmt(f.maxAt)} s; ${f.judgedFrames} of ${f.soundingFrames} sounding frames judged${ca}\n`);
    for (const u of r.unjudged) io.out(`      not judged ${fmt(u.from)}–${fmt(u.to)} s: ${u.reason}\n`);
    for (const m of r.failures) io.out(`      ${m}\n`);
  }
  if (checked.skipped > 0) io.out(`(${checked.skipped} voice(s) of noise or WAV sounds not checked)\n`);
  if (typeof report === 'string') {
    // Never over an input under any name (the script, its WAV sounds, its tuning file, the recording); temporary file, then rename.
    const base = dirname(resolve(scenePath));
    const inputs = [scenePath, ...Object.values(loaded.script.sounds).flatMap((s) => (s.type === 'file' ? [resolve(base, s.path)] : []))];
    if (loaded.script.tuning !== null && 'path' in loaded.script.tuning) inputs.push(resolve(base, loaded.script.tuning.path));
    if (typeof audioPath === 'string') inputs.push(audioPath);
    const doc = { title: scenePath, mode: checked.mode, limits: checked.limits, sources: checked.sources, timeScale: checked.timeScale };
    let bytes: Uint8Array;
    try {
      const ext = extname(report).toLowerCase();
      bytes = ext === '.png' ? await svgToPng(renderReportSvg(doc)) : new TextEncoder().encode(ext === '.svg' ? renderReportSvg(doc) : renderReportHtml(doc));
    } catch (e) {
      // A PNG without the optional rasteriser installed is an output problem with a remedy, not a bug.
      if (/needs the package @resvg\/resvg-wasm/.test((e as Error).message)) throw new CliError(`cannot write ${report}: ${(e as Error).message}`, EXIT.output);
      throw new CliError(`internal error while drawing the report: ${(e as Error).stack ?? String(e)}`, EXIT.internal);
    }
    const file = new SafeFileWriter(report, inputs);
    file.writeAt(bytes, 0);
    file.commit();
    io.out(`report written to ${report}\n`);
  }
  const failed = checked.sources.filter((r) => !r.passed).length;
  io.out(failed === 0 ? `all ${checked.sources.length} voice(s) pass (p95 ≤ ${p95}, max ≤ ${max} cents)\n` : `${failed} of ${checked.sources.length} voice(s) fail\n`);
  return failed === 0 ? EXIT.ok : EXIT.failed;
}

/** The `check` command. */
export const checkCommand: CliCommand = { name: 'check', summary: 'judge heard pitch against Doppler and time-scale physics', usage, run };
