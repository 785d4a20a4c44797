// File helpers of the command-line tool: read and write WAV files with clear errors, and never overwrite an input.
import { existsSync, readFileSync, realpathSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { readWav, writeWav, WavError, type WavAudio, type WavEncoding } from '../offline';
import { peakLevel } from '../../src/analysis';
import { gainToDb } from '../../src/dsp';
import { CliError, EXIT } from './cli-io';

function canonical(path: string): string {
  const abs = resolve(path);
  try {
    return existsSync(abs) ? realpathSync(abs) : abs;
  } catch {
    return abs;
  }
}

/** Throws a usage error when `output` names one of `inputs` (after resolving links). */
export function refuseOverwrite(output: string, inputs: readonly string[]): void {
  const o = canonical(output);
  for (const i of inputs) if (canonical(i) === o) throw new CliError(`refusing to overwrite the input ${i}; choose another output path`, EXIT.usage);
}

/** Reads a WAV file; unreadable or malformed files are input errors. */
export function readWavFile(path: string): WavAudio {
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(path);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new CliError(`cannot read ${path}: ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a directory' : (code ?? (e as Error).message)}`, EXIT.input);
  }
  try {
    return readWav(bytes);
  } catch (e) {
    if (e instanceof WavError) throw new CliError(`${path}: ${e.message}`, EXIT.input);
    throw e;
  }
}

/** Writes channels as a WAV file; failures are output errors. */
export function writeWavFile(path: string, audio: { sampleRate: number; channels: Float32Array[]; encoding: WavEncoding }): void {
  try {
    writeFileSync(path, writeWav(audio));
  } catch (e) {
    throw new CliError(`cannot write ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`, EXIT.output);
  }
}

/** Peak of channels in dBFS (−Infinity for silence). */
export function peakDbfs(channels: readonly Float32Array[]): number {
  let p = 0;
  for (const c of channels) p = Math.max(p, peakLevel(c));
  return gainToDb(p);
}

/** A level in dBFS with one decimal ('−inf' for silence). */
export function formatDb(db: number): string {
  return Number.isFinite(db) ? `${db.toFixed(1)} dBFS` : '-inf dBFS';
}
