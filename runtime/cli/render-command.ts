// `ralenti render <scene.json> -o out.wav`: renders a scene script offline to a WAV file.
import { resolve, dirname } from 'node:path';
import { loadSceneFile, renderLoadedScene, ScriptError, type WavEncoding } from '../offline';
import { gainToDb, qualityTiers } from '../../src/dsp';
import type { QualityTierName } from '../../src/index';
import { CliError, EXIT, choiceOption, numberOption, parseArgs, progressBar, type CliIo } from './cli-io';
import { formatDb, refuseOverwrite, writeWavFile } from './cli-files';
import type { CliCommand } from './cli-command';

const usage = `usage: ralenti render <scene.json> -o <out.wav> [options]

Renders a scene script (see docs/cli.md, "Scene scripts") offline with the engine.

options:
  -o, --output <file>     WAV file to write (required; never one of the inputs)
  --rate <Hz>             output sample rate, 8000…192000 (default: the script's, else 48000)
  --tier <name>           resampler tier: ${qualityTiers.join(', ')} (default: the tuning's)
  --encoding <name>       float32 (default), pcm24 or pcm16
  -q, --quiet             no progress bar
  -h, --help              this help
`;

async function run(args: readonly string[], io: CliIo): Promise<number> {
  const p = parseArgs(args, { output: true, rate: true, tier: true, encoding: true, quiet: false, help: false }, { o: 'output', q: 'quiet', h: 'help' });
  if (p.options.has('help')) {
    io.out(usage);
    return EXIT.ok;
  }
  if (p.positionals.length !== 1) throw new CliError(p.positionals.length === 0 ? 'missing the scene script' : `expected one scene script, got ${p.positionals.length} arguments`, EXIT.usage);
  const output = p.options.get('output');
  if (typeof output !== 'string') throw new CliError('missing -o <out.wav>', EXIT.usage);
  const rate = numberOption(p, 'rate', 8000, 192000);
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
  const bar = p.options.has('quiet') ? null : progressBar(io, 'rendering');
  const result = renderLoadedScene(loaded.script, loaded.sounds, loaded.tuning, { sampleRate: rate, tier, onProgress: bar ? (f) => bar.update(f) : undefined });
  bar?.done();
  writeWavFile(output, { sampleRate: result.sampleRate, channels: [result.left, result.right], encoding });
  const s = result.stats;
  io.out(
    `rendered ${loaded.script.duration.toFixed(2)} s at ${result.sampleRate} Hz to ${output} (${encoding}, ${s.engine.tier} tier)\n` +
      `voices: ${s.voicesStarted} started, ${s.voicesRefused} refused, at most ${s.maxVoices} at once, ${s.engine.steals} stolen\n` +
      `peak: ${formatDb(gainToDb(s.peak))} (before the limiter ${formatDb(gainToDb(s.peakBeforeLimiter))}), limiter reduction at most ${(-s.limiterDb).toFixed(1)} dB\n` +
      `clamps: ${s.engine.clamps}, errors: ${s.engine.errors}\n`,
  );
  return EXIT.ok;
}

/** The `render` command. */
export const renderCommand: CliCommand = { name: 'render', summary: 'render a scene script to a WAV file', usage, run };
