// File helpers of the command-line tool: inputs and outputs compared by device and inode (not only by name), WAV
// files read block by block, and outputs written to a temporary file in their folder then renamed into place.
import { closeSync, fstatSync, readFileSync, openSync, readSync, realpathSync, renameSync, statSync, unlinkSync, writeSync, constants } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { parseWavLayout, decodeFrames, readWav, WavError, type WavAudio, type WavLayout, type SampleCounts } from '../offline';
import { CliError, EXIT } from './cli-io';

/** Device and inode of an existing file (links followed), or null when nothing is there. */
function identity(path: string): { dev: number; ino: number } | null {
  try {
    const s = statSync(path);
    return { dev: s.dev, ino: s.ino };
  } catch {
    return null;
  }
}

function canonical(path: string): string {
  const abs = resolve(path);
  try {
    return realpathSync(abs);
  } catch {
    return abs;
  }
}

/**
 * Throws a usage error when `output` is one of `inputs` under any name: the same path after resolving links, or
 * the same file (device and inode: hard links, bind mounts, case-insensitive spellings, /proc aliases).
 */
export function refuseOverwrite(output: string, inputs: readonly string[]): void {
  const o = canonical(output);
  const oid = identity(output);
  for (const i of inputs) {
    const iid = identity(i);
    const same = canonical(i) === o || (oid !== null && iid !== null && oid.dev === iid.dev && oid.ino === iid.ino);
    if (same) throw new CliError(`refusing to overwrite the input ${i} (${output} is the same file); choose another output path`, EXIT.usage);
  }
}

function readError(path: string, e: unknown): CliError {
  const code = (e as NodeJS.ErrnoException).code;
  return new CliError(`cannot read ${path}: ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a directory' : (code ?? (e as Error).message)}`, EXIT.input);
}

/** A WAV file open for block reads: its layout, and decoding of any frame range into caller-owned channels. */
export class WavFileReader {
  /** The header's facts (rate, channels, encoding, frames). */
  readonly layout: WavLayout;
  /** Input samples clamped or replaced so far (beyond ±WAV_SAMPLE_BOUND, or non-finite), and the peak seen. */
  readonly counts: SampleCounts = { clamped: 0, peak: 0 };
  private readonly fd: number;
  private buf = new Uint8Array(0);

  /** Opens and parses `path`; unreadable or malformed files are input errors. */
  constructor(readonly path: string) {
    try {
      this.fd = openSync(path, constants.O_RDONLY);
      if (!fstatSync(this.fd).isFile()) {
        closeSync(this.fd);
        throw Object.assign(new Error('not a file'), { code: 'EISDIR' });
      }
    } catch (e) {
      throw readError(path, e);
    }
    try {
      const size = fstatSync(this.fd).size;
      this.layout = parseWavLayout((o, n) => this.bytesAt(o, n), size);
    } catch (e) {
      closeSync(this.fd);
      if (e instanceof WavError) throw new CliError(`${path}: ${e.message}`, EXIT.input);
      throw readError(path, e);
    }
  }

  private bytesAt(offset: number, length: number): Uint8Array {
    if (this.buf.length < length) this.buf = new Uint8Array(Math.max(length, 1 << 16));
    let got = 0;
    while (got < length) {
      const n = readSync(this.fd, this.buf, got, length - got, offset + got);
      if (n === 0) break;
      got += n;
    }
    return this.buf.subarray(0, got);
  }

  /** Decodes frames [from, from + frames) into out[c][at…] (channels beyond out.length are skipped). */
  read(from: number, frames: number, out: readonly Float32Array[], at = 0): void {
    const l = this.layout;
    const frameBytes = l.channels * l.bytesPerSample;
    const bytes = this.bytesAt(l.dataStart + from * frameBytes, frames * frameBytes);
    if (bytes.length < frames * frameBytes) throw new CliError(`${this.path}: the file shrank while it was read`, EXIT.input);
    decodeFrames(bytes, l, frames, out, at, this.counts);
  }

  /** Closes the file. */
  close(): void {
    closeSync(this.fd);
  }
}

/**
 * Writes a file safely: bytes go to a new temporary file in the output's folder (created exclusively), which is
 * renamed over the output only on `commit` — after checking again that the output is not one of `inputs`. An
 * interrupted or failed write leaves the output as it was and removes the temporary file.
 */
export class SafeFileWriter {
  private fd: number;
  private readonly temp: string;
  private finished = false;
  private readonly onSignal = () => {
    this.abort();
    process.exit(130);
  };

  /** Creates the temporary file next to `output`; failures are output errors. */
  constructor(readonly output: string, private readonly inputs: readonly string[]) {
    refuseOverwrite(output, inputs);
    const out = resolve(output);
    try {
      if (statSync(out, { throwIfNoEntry: false })?.isDirectory()) throw Object.assign(new Error('is a directory'), { code: 'EISDIR' });
    } catch (e) {
      throw writeError(output, e);
    }
    this.temp = join(dirname(out), `.${basename(out)}.${process.pid}-${Math.floor(Math.random() * 1e9).toString(36)}.part`);
    try {
      this.fd = openSync(this.temp, constants.O_WRONLY | constants.O_CREAT | constants.O_EXCL, 0o666);
    } catch (e) {
      throw writeError(output, e);
    }
    process.once('SIGINT', this.onSignal);
    process.once('SIGTERM', this.onSignal);
  }

  /** Writes `bytes` at byte `position` of the temporary file. */
  writeAt(bytes: Uint8Array, position: number): void {
    try {
      let done = 0;
      while (done < bytes.length) done += writeSync(this.fd, bytes, done, bytes.length - done, position + done);
    } catch (e) {
      this.abort();
      throw writeError(this.output, e);
    }
  }

  /** Renames the finished file into place (refusing again if the output has become an input meanwhile). */
  commit(): void {
    try {
      closeSync(this.fd);
      this.fd = -1;
      refuseOverwrite(this.output, this.inputs);
      renameSync(this.temp, resolve(this.output));
    } catch (e) {
      this.abort();
      throw e instanceof CliError ? e : writeError(this.output, e);
    }
    this.release();
  }

  /** Discards the temporary file; the output is untouched. Safe to call more than once. */
  abort(): void {
    if (this.finished) return;
    if (this.fd >= 0) {
      try {
        closeSync(this.fd);
      } catch {
        // already closed
      }
      this.fd = -1;
    }
    try {
      unlinkSync(this.temp);
    } catch {
      // already gone
    }
    this.release();
  }

  private release(): void {
    this.finished = true;
    process.off('SIGINT', this.onSignal);
    process.off('SIGTERM', this.onSignal);
  }
}

function writeError(path: string, e: unknown): CliError {
  return new CliError(`cannot write ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`, EXIT.output);
}

/** A level in dBFS with one decimal ('−inf' for silence). */
export function formatDb(db: number): string {
  return Number.isFinite(db) ? `${db.toFixed(1)} dBFS` : '-inf dBFS';
}

/** Reads a whole WAV file (a bounded recording, for `check --audio`); unreadable or malformed files are input errors. */
export function readWavFile(path: string): WavAudio {
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(path);
  } catch (e) {
    throw readError(path, e);
  }
  try {
    return readWav(bytes);
  } catch (e) {
    if (e instanceof WavError) throw new CliError(`${path}: ${e.message}`, EXIT.input);
    throw e;
  }
}
