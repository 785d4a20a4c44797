// `ralenti render <scene.json> -o out.wav`: renders a scene script offline to a WAV file, streamed to disk a
// block at a time (memory bounded by the scene's sounds, not by its duration).
import { resolve, dirname } from 'node:path';
import { loadSceneFile, SceneRun, ScriptError, type LoadedScene, type SceneRenderOptions, type WavEncoding } from '../offline';
import { gainToDb, qualityTiers } from '../../src/dsp';
import type { QualityTierName } from '../../src/index';
import { CliError, EXIT, choiceOption, numberOption, parseArgs, progressBar, type CliIo } from './cli-io';
import { formatDb, refuseOverwrite } from './cli-files';
import { WavFileWriter } from './wav-file-writer';
import { clipReport, gainFromOptions, NORMALIZE_PEAK_DB, yieldToEvents } from './cli-levels';
import type { CliCommand } from './cli-command';

const usage = `usage: ralenti render <scene.json> -o <out.wav> [options]

Renders a scene script (see docs/cli.md, "Scene scripts") offline with the engine.

options:
  -o, --output <file>     WAV file to write (required; never one of the inputs)
  --rate <Hz>             output sample rate, a whole number 8000…192000 (default: the script's, else 48000)
  --tier <name>           resampler tier: ${qualityTiers.join(', ')} (default: the tuning's)
  --encoding <name>       float32 (default), pcm24 or pcm16 (TPDF-dithered)
  --gain <dB>             gain applied after the engine's limiter, -60…60 dB (default 0)
  --normalize             scale the output so that its peak is ${NORMALIZE_PEAK_DB} dBFS (renders twice)
  -q, --quiet             no progress bar
  -h, --help              this help
`;

async function run(args: readonly string[], io: CliIo): Promise<number> {
  const p = parseArgs(args, { output: true, rate: true, tier: true, encoding: true, gain: true, normalize: false, quiet: false, help: false }, { o: 'output', q: 'quiet', h: 'help' });
  if (p.options.has('help')) {
    io.out(usage);
    return EXIT.ok;
  }
  if (p.positionals.length !== 1) throw new CliError(p.positionals.length === 0 ? 'missing the scene script' : `expected one scene script, got ${p.positionals.length} arguments`, EXIT.usage);
  const output = p.options.get('output');
  if (typeof output !== 'string') throw new CliError('missing -o <out.wav>', EXIT.usage);
  const rate = numberOption(p, 'rate', 8000, 192000);
  if (rate !== undefined && !Number.isInteger(rate)) throw new CliError(`--rate must be a whole number of hertz, got ${p.options.get('rate')}`, EXIT.usage);
  const gainDb = numberOption(p, 'gain', -60, 60);
  const normalize = p.options.has('normalize');
  if (normalize && gainDb !== undefined) throw new CliError('use either --gain or --normalize, not both', EXIT.usage);
  const tier = choiceOption(p, 'tier', qualityTiers as readonly QualityTierName[]);
  const encoding = choiceOption<WavEncoding>(p, 'encoding', ['float32', 'pcm24', 'pcm16'], 'float32')!;
  const scenePath = p.positionals[0];
  let loaded;
  try {
    loaded = loadSceneFile(scenePath, rate);
  } catch (e) {
    if (e instanceof ScriptError) throw new CliError(`${scenePath}: ${e.message}`, EXIT.input);
    throw e;
  }
  const base = dirname(resolve(scenePath));
  const inputs = [scenePath, ...Object.values(loaded.script.sounds).flatMap((s) => (s.type === 'file' ? [resolve(base, s.path)] : []))];
  if (loaded.script.tuning !== null && 'path' in loaded.script.tuning) inputs.push(resolve(base, loaded.script.tuning.path));
  refuseOverwrite(output, inputs);
  const quiet = p.options.has('quiet');
  const options: SceneRenderOptions = { sampleRate: rate, tier };
  let gain = gainFromOptions(gainDb, null);
  if (normalize) gain = gainFromOptions(undefined, (await renderPass(loaded, options, quiet ? null : io, 'measuring', null)).stats.peak);
  const sr = rate ?? loaded.script.sampleRate;
  const writer = new WavFileWriter(output, inputs, { sampleRate: sr, channels: 2, encoding, gain });
  let run: SceneRun;
  try {
    run = await renderPass(loaded, options, quiet ? null : io, 'rendering', writer);
    writer.finish();
  } catch (e) {
    writer.abort();
    throw e;
  }
  const s = run.stats;
  io.out(
    `rendered ${loaded.script.duration.toFixed(2)} s at ${run.sampleRate} Hz to ${output} (${encoding}${encoding === 'pcm16' ? ', TPDF dither' : ''}, ${s.engine.tier} tier)\n` +
      `voices: ${s.voicesStarted} started, ${s.voicesRefused} refused, at most ${s.maxVoices} at once, ${s.engine.steals} stolen\n` +
      `peak: ${formatDb(gainToDb(writer.counts.peak))} after gain ${gainToDb(gain).toFixed(1)} dB (engine: ${formatDb(gainToDb(s.peak))}, before its limiter ${formatDb(gainToDb(s.peakBeforeLimiter))}), limiter reduction at most ${(-s.limiterDb).toFixed(1)} dB\n` +
      clipReport(writer.counts, encoding, loaded.inputClamped ?? 0) +
      `clamps: ${s.engine.clamps}, blasts muted: ${s.engine.blasts}, errors: ${s.engine.errors}\n`,
  );
  return EXIT.ok;
}

/** Renders the scene once, a block at a time, into `writer` (or only measuring when null), with a progress bar on `io`. */
async function renderPass(loaded: LoadedScene, options: SceneRenderOptions, io: CliIo | null, label: string, writer: WavFileWriter | null): Promise<SceneRun> {
  const bar = io === null ? null : progressBar(io, label);
  const run = new SceneRun(loaded.script, loaded.sounds, loaded.tuning, { ...options, onProgress: bar ? (f) => bar.update(f) : undefined });
  const block = [run.left, run.right];
  try {
    for (let n = run.step(), k = 0; n > 0; n = run.step(), k++) {
      writer?.write(block, n);
      if (k % 256 === 255) await yieldToEvents();
    }
  } finally {
    run.dispose(); // also on a failed write: the engine's memory goes back at once
    bar?.done();
  }
  return run;
}

/** The `render` command. */
export const renderCommand: CliCommand = { name: 'render', summary: 'render a scene script to a WAV file', usage, run };
