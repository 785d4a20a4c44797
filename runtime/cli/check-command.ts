// `ralenti check <scene.json>`: renders each tonal voice solo, tracks its pitch (YIN, src/analysis) and compares it
// with the heard frequency expected from the motion and tuning alone (runtime/check); writes an optional report.
import { dirname, extname, resolve } from 'node:path';
import { loadSceneFile, ScriptError, type LoadedScene } from '../offline';
import { checkScene, renderReportHtml, renderReportSvg } from '../check';
import { refuseOverwrite, SafeFileWriter } from './cli-files';
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

async function run(args: readonly string[], io: CliIo): Promise<number> {
  const p = parseArgs(args, { report: true, 'tolerance-cents': true, rate: true, quiet: false, help: false }, { q: 'quiet', h: 'help' });
  if (p.options.has('help')) {
    io.out(usage);
    return EXIT.ok;
  }
  if (p.positionals.length !== 1) throw new CliError(p.positionals.length === 0 ? 'missing the scene script' : `expected one scene script, got ${p.positionals.length} arguments`, EXIT.usage);
  const tolerance = numberOption(p, 'tolerance-cents', 0.1, 1200, 5)!;
  const rate = numberOption(p, 'rate', 8000, 192000);
  if (rate !== undefined && !Number.isInteger(rate)) throw new CliError(`--rate must be a whole number of hertz, got ${p.options.get('rate')}`, EXIT.usage);
  const report = p.options.get('report');
  if (report !== undefined && (typeof report !== 'string' || !/\.(svg|html?)$/i.test(report))) throw new CliError(`--report must name a .svg or .html file, got ${JSON.stringify(report)}`, EXIT.usage);
  const scenePath = p.positionals[0];
  if (typeof report === 'string') refuseOverwrite(report, [scenePath]);
  let loaded: LoadedScene;
  try {
    loaded = loadSceneFile(scenePath, rate);
  } catch (e) {
    if (e instanceof ScriptError) throw new CliError(`${scenePath}: ${e.message}`, EXIT.input);
    throw e;
  }
  const tonal = loaded.script.voices.filter((v) => loaded.sounds[v.sound].frequency !== null).length;
  if (tonal === 0) throw new CliError(`${scenePath}: no voice plays a tone or hum sound, so there is no pitch to check (noise and WAV sounds are not checked)`, EXIT.input);
  const bar = p.options.has('quiet') ? null : progressBar(io, 'checking');
  const checked = checkScene(loaded, { toleranceCents: tolerance, sampleRate: rate, onProgress: bar ? (f) => bar.update(f) : undefined });
  const results = checked.sources;
  const skipped = checked.skipped;
  bar?.done();
  const lines = results.map(
    (r) => `${r.passed ? 'PASS' : 'FAIL'}  ${r.name}: median ${r.stats.medianCents.toFixed(2)}, p95 ${r.stats.p95Cents.toFixed(2)}, max ${r.stats.maxCents.toFixed(2)} cents over ${r.stats.count} frames`,
  );
  io.out(`${lines.join('\n')}\n`);
  if (skipped > 0) io.out(`(${skipped} voice(s) of noise or WAV sounds not checked)\n`);
  if (typeof report === 'string') {
    // Never over an input under any name (the script, its WAV sounds, its tuning file); temporary file, then rename.
    const base = dirname(resolve(scenePath));
    const inputs = [scenePath, ...Object.values(loaded.script.sounds).flatMap((s) => (s.type === 'file' ? [resolve(base, s.path)] : []))];
    if (loaded.script.tuning !== null && 'path' in loaded.script.tuning) inputs.push(resolve(base, loaded.script.tuning.path));
    const doc = { title: scenePath, toleranceCents: tolerance, sources: results, timeScale: checked.timeScale };
    const text = extname(report).toLowerCase() === '.svg' ? renderReportSvg(doc) : renderReportHtml(doc);
    const file = new SafeFileWriter(report, inputs);
    file.writeAt(new TextEncoder().encode(text), 0);
    file.commit();
    io.out(`report written to ${report}\n`);
  }
  const failed = results.filter((r) => !r.passed).length;
  io.out(failed === 0 ? `all ${results.length} voice(s) within ${tolerance} cents\n` : `${failed} of ${results.length} voice(s) outside ${tolerance} cents\n`);
  return failed === 0 ? EXIT.ok : EXIT.failed;
}

/** The `check` command. */
export const checkCommand: CliCommand = { name: 'check', summary: 'check heard pitch against the Doppler and time-scale expectation', usage, run };
