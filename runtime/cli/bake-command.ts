// `ralenti bake <in.wav> --speed V -o out.wav`: variable-speed replay of a file (band-limited resampling),
// for pre-rendering slowed or sped-up variants of assets. Pitch and duration change together.
import { resample, qualityTiers, MAX_RATIO, ratioToCents } from '../../src/dsp';
import type { QualityTierName } from '../../src/index';
import type { WavEncoding } from '../offline';
import { CliError, EXIT, choiceOption, numberOption, parseArgs, progressBar, type CliIo } from './cli-io';
import { formatDb, peakDbfs, readWavFile, refuseOverwrite, writeWavFile } from './cli-files';
import type { CliCommand } from './cli-command';

const MIN_SPEED = 1 / 64;

const usage = `usage: ralenti bake <in.wav> --speed <V> -o <out.wav> [options]

Replays a WAV file at speed V (0.25 = four times slower and two octaves down), with the
engine's band-limited resampler, at the file's own sample rate.

options:
  --speed <V>             playback speed, ${MIN_SPEED}…${MAX_RATIO} (required)
  -o, --output <file>     WAV file to write (required; never the input)
  --tier <name>           resampler tier: ${qualityTiers.join(', ')} (default standard)
  --encoding <name>       float32, pcm24 or pcm16 (default: the input's)
  -q, --quiet             no progress on stderr
  -h, --help              this help
`;

async function run(args: readonly string[], io: CliIo): Promise<number> {
  const p = parseArgs(args, { output: true, speed: true, tier: true, encoding: true, quiet: false, help: false }, { o: 'output', q: 'quiet', h: 'help' });
  if (p.options.has('help')) {
    io.out(usage);
    return EXIT.ok;
  }
  if (p.positionals.length !== 1) throw new CliError(p.positionals.length === 0 ? 'missing the input WAV file' : `expected one input file, got ${p.positionals.length} arguments`, EXIT.usage);
  const output = p.options.get('output');
  if (typeof output !== 'string') throw new CliError('missing -o <out.wav>', EXIT.usage);
  if (!p.options.has('speed')) throw new CliError('missing --speed <V>', EXIT.usage);
  const speed = numberOption(p, 'speed', MIN_SPEED, MAX_RATIO)!;
  const tier = choiceOption(p, 'tier', qualityTiers as readonly QualityTierName[], 'standard')!;
  const encoding = choiceOption<WavEncoding>(p, 'encoding', ['float32', 'pcm24', 'pcm16']);
  const input = p.positionals[0];
  refuseOverwrite(output, [input]);
  const wav = readWavFile(input);
  if (wav.channels[0].length === 0) throw new CliError(`${input} holds no samples`, EXIT.input);
  const bar = p.options.has('quiet') ? null : progressBar(io, 'baking');
  const channels = wav.channels.map((c, i, all) => {
    const out = resample(c, speed, { quality: tier });
    bar?.update((i + 1) / all.length);
    return out;
  });
  bar?.done();
  const enc: WavEncoding = encoding ?? (wav.encoding === 'pcm32' ? 'float32' : wav.encoding);
  writeWavFile(output, { sampleRate: wav.sampleRate, channels, encoding: enc });
  const inSeconds = wav.channels[0].length / wav.sampleRate;
  const outSeconds = channels[0].length / wav.sampleRate;
  io.out(
    `baked ${input} at speed ${speed} (${ratioToCents(speed).toFixed(1)} cents, ${tier} tier) to ${output}\n` +
      `${wav.channels.length} channel(s) at ${wav.sampleRate} Hz, ${inSeconds.toFixed(3)} s → ${outSeconds.toFixed(3)} s (${enc}), peak ${formatDb(peakDbfs(channels))}\n`,
  );
  return EXIT.ok;
}

/** The `bake` command. */
export const bakeCommand: CliCommand = { name: 'bake', summary: 'replay a WAV file at another speed (pre-rendered slow variants)', usage, run };
