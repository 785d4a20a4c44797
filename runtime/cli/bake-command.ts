// `ralenti bake <in.wav> --speed V -o out.wav`: variable-speed replay of a file (band-limited resampling),
// for pre-rendering slowed or sped-up variants of assets. Pitch and duration change together. Streams: the input
// is read and the output written block by block, so memory stays bounded for any length.
import { qualityTiers, MAX_RATIO, ratioToCents, gainToDb } from '../../src/dsp';
import type { QualityTierName } from '../../src/index';
import { BakeStream, WAV_SAMPLE_BOUND, type WavEncoding } from '../offline';
import { CliError, EXIT, choiceOption, numberOption, parseArgs, progressBar, type CliIo } from './cli-io';
import { formatDb, refuseOverwrite, WavFileReader } from './cli-files';
import { WavFileWriter } from './wav-file-writer';
import { clipReport, gainFromOptions, NORMALIZE_PEAK_DB, yieldToEvents } from './cli-levels';
import type { CliCommand } from './cli-command';

const MIN_SPEED = 1 / 64;
/** Most channels a bake takes (memory stays bounded per channel). */
export const BAKE_MAX_CHANNELS = 64;

const usage = `usage: ralenti bake <in.wav> --speed <V> -o <out.wav> [options]

Replays a WAV file at speed V (0.25 = four times slower and two octaves down), with the
engine's band-limited resampler, at the file's own sample rate (8000…384000 Hz).

options:
  --speed <V>             playback speed, ${MIN_SPEED}…${MAX_RATIO} (required)
  -o, --output <file>     WAV file to write (required; never the input, under any name)
  --tier <name>           resampler tier: ${qualityTiers.join(', ')} (default standard)
  --encoding <name>       float32, pcm24 or pcm16 (default: the input's); pcm16 is TPDF-dithered
  --gain <dB>             gain applied to the output, -60…60 dB (default 0)
  --normalize             scale the output so that its peak is ${NORMALIZE_PEAK_DB} dBFS (reads the input twice)
  -q, --quiet             no progress on stderr
  -h, --help              this help

Input samples beyond ±${WAV_SAMPLE_BOUND} (+24 dBFS) or not finite are clamped and counted; output samples beyond
0 dBFS are counted and reported (integer encodings clip them).
`;

async function run(args: readonly string[], io: CliIo): Promise<number> {
  const p = parseArgs(args, { output: true, speed: true, tier: true, encoding: true, gain: true, normalize: false, quiet: false, help: false }, { o: 'output', q: 'quiet', h: 'help' });
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
  const gainDb = numberOption(p, 'gain', -60, 60);
  const normalize = p.options.has('normalize');
  if (normalize && gainDb !== undefined) throw new CliError('use either --gain or --normalize, not both', EXIT.usage);
  const quiet = p.options.has('quiet');
  const input = p.positionals[0];
  refuseOverwrite(output, [input]);
  const wav = new WavFileReader(input);
  try {
    const l = wav.layout;
    if (l.frames === 0) throw new CliError(`${input} holds no samples`, EXIT.input);
    if (l.channels > BAKE_MAX_CHANNELS) throw new CliError(`${input} has ${l.channels} channels; bake takes at most ${BAKE_MAX_CHANNELS}`, EXIT.input);
    const source = { frames: l.frames, channels: l.channels, sampleRate: l.sampleRate, read: (from: number, frames: number, out: readonly Float32Array[]) => wav.read(from, frames, out) };
    let gain = gainFromOptions(gainDb, null);
    if (normalize) {
      // First pass: the peak of the output, so that the second pass can scale it exactly.
      const bar = quiet ? null : progressBar(io, 'measuring');
      const measure = new BakeStream(source, speed, tier);
      let peak = 0;
      for (let n = measure.next(), k = 0; n > 0; n = measure.next(), k++) {
        for (const b of measure.block) for (let i = 0; i < n; i++) peak = Math.max(peak, Math.abs(b[i]));
        bar?.update(measure.produced / measure.totalFrames);
        if (k % 16 === 15) await yieldToEvents();
      }
      measure.dispose();
      bar?.done();
      gain = gainFromOptions(undefined, peak);
      wav.counts.clamped = 0;
      wav.counts.peak = 0;
    }
    const enc: WavEncoding = encoding ?? (l.encoding === 'pcm32' ? 'float32' : l.encoding);
    const writer = new WavFileWriter(output, [input], { sampleRate: l.sampleRate, channels: l.channels, encoding: enc, gain });
    const stream = new BakeStream(source, speed, tier);
    const bar = quiet ? null : progressBar(io, 'baking');
    try {
      for (let n = stream.next(), k = 0; n > 0; n = stream.next(), k++) {
        writer.write(stream.block, n);
        bar?.update(stream.produced / stream.totalFrames);
        if (k % 16 === 15) await yieldToEvents();
      }
      writer.finish();
    } catch (e) {
      writer.abort();
      throw e;
    } finally {
      stream.dispose();
      bar?.done();
    }
    const inSeconds = l.frames / l.sampleRate;
    const outSeconds = writer.frames / l.sampleRate;
    io.out(
      `baked ${input} at speed ${speed} (${ratioToCents(speed).toFixed(1)} cents, ${tier} tier) to ${output}\n` +
        `${l.channels} channel(s) at ${l.sampleRate} Hz, ${inSeconds.toFixed(3)} s → ${outSeconds.toFixed(3)} s (${enc}${enc === 'pcm16' ? ', TPDF dither' : ''}), ` +
        `gain ${gainToDb(gain).toFixed(1)} dB, peak ${formatDb(gainToDb(writer.counts.peak))}\n` +
        clipReport(writer.counts, enc, wav.counts.clamped),
    );
    return EXIT.ok;
  } finally {
    wav.close();
  }
}

/** The `bake` command. */
export const bakeCommand: CliCommand = { name: 'bake', summary: 'replay a WAV file at another speed (pre-rendered slow variants)', usage, run };
