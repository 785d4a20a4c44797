// A WAV file written block by block through a SafeFileWriter: a provisional header, samples encoded per block
// (16-bit with TPDF dither), then the final header and the rename into place.
import { wavHeader, encodeFrames, bytesPerSampleOf, TpdfDither, WavError, type WavEncoding, type SampleCounts } from '../offline';
import { CliError, EXIT } from './cli-io';
import { SafeFileWriter } from './cli-files';

/** Options of WavFileWriter. */
export interface WavFileWriterOptions {
  /** Sample rate, Hz (integer, 8000…384000). */
  sampleRate: number;
  /** Channel count (1…65535). */
  channels: number;
  /** Sample encoding. */
  encoding: WavEncoding;
  /** Linear gain applied to every sample (default 1). */
  gain?: number;
}

/** Streams a WAV file to `output` (never one of `inputs`); counts samples beyond full scale and the peak. */
export class WavFileWriter {
  /** Samples beyond ±1 after gain (clipped by integer encodings) and the peak |sample| after gain. */
  readonly counts: SampleCounts = { clamped: 0, peak: 0 };
  /** Frames written so far. */
  frames = 0;
  private readonly file: SafeFileWriter;
  private readonly dither: TpdfDither | null;
  private bytes = new Uint8Array(0);
  private readonly frameBytes: number;

  /** Creates the temporary file and writes a provisional header; bad rates or paths throw CliError. */
  constructor(output: string, inputs: readonly string[], private readonly options: WavFileWriterOptions) {
    try {
      wavHeader(options.sampleRate, options.channels, options.encoding, 0);
    } catch (e) {
      if (e instanceof WavError) throw new CliError(e.message, EXIT.usage);
      throw e;
    }
    this.file = new SafeFileWriter(output, inputs);
    this.file.writeAt(wavHeader(options.sampleRate, options.channels, options.encoding, 0), 0);
    this.dither = options.encoding === 'pcm16' ? new TpdfDither() : null;
    this.frameBytes = options.channels * bytesPerSampleOf(options.encoding);
  }

  /** Appends frames [0, frames) of `channels`. */
  write(channels: readonly Float32Array[], frames: number): void {
    const need = frames * this.frameBytes;
    if (44 + (this.frames + frames) * this.frameBytes > 0xffffffff - 1) {
      this.file.abort();
      throw new CliError(`cannot write ${this.file.output}: audio too long for a WAV file (over 4 GiB)`, EXIT.output);
    }
    if (this.bytes.length < need) this.bytes = new Uint8Array(need);
    const out = this.bytes.subarray(0, need);
    encodeFrames(channels, 0, frames, this.options.encoding, this.options.gain ?? 1, out, this.counts, this.dither);
    this.file.writeAt(out, 44 + this.frames * this.frameBytes);
    this.frames += frames;
  }

  /** Writes the final header (and the pad byte of an odd data size) and renames the file into place. */
  finish(): void {
    const dataBytes = this.frames * this.frameBytes;
    if (dataBytes & 1) this.file.writeAt(new Uint8Array(1), 44 + dataBytes);
    this.file.writeAt(wavHeader(this.options.sampleRate, this.options.channels, this.options.encoding, this.frames), 0);
    this.file.commit();
  }

  /** Discards the temporary file, leaving the output as it was. */
  abort(): void {
    this.file.abort();
  }
}
