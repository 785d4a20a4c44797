// The command-line tool under bad files: truncated, empty, non-WAV, 8-bit and 64-bit WAV inputs, unwritable outputs
// and an output that is the input. Each gives a clear message and its exit code, and no file is damaged: every input
// keeps its bytes, and an existing output is left as it was when the command fails.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync, readFileSync, rmSync, symlinkSync, mkdirSync, readdirSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { EXIT } from '../../runtime/cli/cli-io';
import { writeWav } from '../../runtime/offline';
import { runCli } from '../runtime/cli/run-cli';

const dir = mkdtempSync(join(tmpdir(), 'ralenti-reliability-cli-'));
const files: Record<string, Buffer> = {};

/** A canonical 44-byte-header WAV (RIFF/WAVE, fmt, data: Microsoft/IBM RIFF WAVE format, common practice) with any format tag and width. */
function wavHeader(format: number, bits: number, channels: number, rate: number, frames: number): Buffer {
  const bytesPer = bits / 8;
  const data = frames * channels * bytesPer;
  const b = Buffer.alloc(44 + data);
  b.write('RIFF', 0, 'latin1');
  b.writeUInt32LE(36 + data, 4);
  b.write('WAVE', 8, 'latin1');
  b.write('fmt ', 12, 'latin1');
  b.writeUInt32LE(16, 16);
  b.writeUInt16LE(format, 20);
  b.writeUInt16LE(channels, 22);
  b.writeUInt32LE(rate, 24);
  b.writeUInt32LE(rate * channels * bytesPer, 28);
  b.writeUInt16LE(channels * bytesPer, 32);
  b.writeUInt16LE(bits, 34);
  b.write('data', 36, 'latin1');
  b.writeUInt32LE(data, 40);
  for (let i = 44; i < b.length; i++) b[i] = (i * 37) & 0xff;
  return b;
}

const path = (name: string) => join(dir, name);

beforeAll(() => {
  const x = new Float32Array(4800).map((_, i) => 0.5 * Math.sin((2 * Math.PI * 440 * i) / 48000));
  const good = Buffer.from(writeWav({ sampleRate: 48000, channels: [x], encoding: 'pcm16' }));
  files['good.wav'] = good;
  files['empty.wav'] = Buffer.alloc(0);
  files['header-only.wav'] = good.subarray(0, 20);
  files['truncated-data.wav'] = good.subarray(0, 44 + 1000);
  files['text.wav'] = Buffer.from('this is not audio\n');
  files['png.wav'] = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52]);
  files['pcm8.wav'] = wavHeader(1, 8, 1, 48000, 480);
  files['float64.wav'] = wavHeader(3, 64, 1, 48000, 480);
  files['zero-channels.wav'] = wavHeader(1, 16, 0, 48000, 0);
  files['existing-out.wav'] = Buffer.from('an earlier render the user wants to keep');
  files['scene-pcm8.json'] = Buffer.from(JSON.stringify({ version: 1, duration: 1, sounds: { s: { type: 'file', path: 'pcm8.wav' } }, voices: [{ sound: 's' }] }));
  files['scene-truncated.json'] = Buffer.from('{"version": 1, "duration": 1, "sounds": {');
  files['scene-good.json'] = Buffer.from(JSON.stringify({ version: 1, duration: 0.2, sounds: { s: { type: 'file', path: 'good.wav' } }, voices: [{ sound: 's' }] }));
  for (const [name, bytes] of Object.entries(files)) writeFileSync(path(name), bytes);
  writeFileSync(path('a-file'), 'x');
  mkdirSync(path('a-directory'));
  symlinkSync(path('good.wav'), path('link-to-good.wav'));
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

const cli = (argv: string[]) => runCli(argv);

const bake = (input: string, output: string) => ['bake', path(input), '--speed', '0.5', '-o', output.startsWith('/') ? output : path(output)];

const cases: [string, string[], number, RegExp][] = [
  ['an empty WAV', bake('empty.wav', 'o1.wav'), EXIT.input, /empty\.wav: not a WAV file: only 0 bytes/],
  ['a WAV cut inside its header', bake('header-only.wav', 'o2.wav'), EXIT.input, /header-only\.wav: .*(truncated|fmt)/],
  ['a WAV cut inside its data', bake('truncated-data.wav', 'o3.wav'), EXIT.input, /truncated-data\.wav: truncated WAV file: the data chunk declares/],
  ['a text file', bake('text.wav', 'o4.wav'), EXIT.input, /text\.wav: not a WAV file/],
  ['a PNG file', bake('png.wav', 'o5.wav'), EXIT.input, /png\.wav: not a WAV file/],
  ['an 8-bit PCM WAV', bake('pcm8.wav', 'o6.wav'), EXIT.input, /pcm8\.wav: unsupported WAV encoding: 8-bit/],
  ['a 64-bit float WAV', bake('float64.wav', 'o7.wav'), EXIT.input, /float64\.wav: unsupported WAV encoding: 64-bit/],
  ['a WAV with zero channels', bake('zero-channels.wav', 'o8.wav'), EXIT.input, /zero-channels\.wav: malformed WAV file: zero channels/],
  ['a missing input', bake('missing.wav', 'o9.wav'), EXIT.input, /cannot read .*missing\.wav: no such file/],
  ['a directory as the input', ['bake', path('a-directory'), '--speed', '0.5', '-o', path('o10.wav')], EXIT.input, /it is a directory/],
  ['an output in a missing folder', bake('good.wav', 'no-such-folder/o.wav'), EXIT.output, /cannot write .*ENOENT/],
  ['an output below a regular file', bake('good.wav', 'a-file/o.wav'), EXIT.output, /cannot write .*ENOTDIR/],
  ['a directory as the output', bake('good.wav', 'a-directory'), EXIT.output, /cannot write .*EISDIR/],
  ['the input as the output', bake('good.wav', 'good.wav'), EXIT.usage, /refusing to overwrite the input/],
  ['the input as the output, spelled another way', bake('good.wav', `${dir}/a-directory/../good.wav`), EXIT.usage, /refusing to overwrite the input/],
  ['the input as the output through a symbolic link', bake('good.wav', 'link-to-good.wav'), EXIT.usage, /refusing to overwrite the input/],
  ['a scene whose sound file is 8-bit', ['render', path('scene-pcm8.json'), '-q', '-o', path('o11.wav')], EXIT.input, /sounds\.s\.path: unsupported WAV encoding: 8-bit/],
  ['a truncated scene script', ['render', path('scene-truncated.json'), '-q', '-o', path('o12.wav')], EXIT.input, /scene-truncated\.json/],
  ['a scene rendered over its own sound file', ['render', path('scene-good.json'), '-q', '-o', path('good.wav')], EXIT.usage, /refusing to overwrite the input/],
  ['a scene rendered over itself', ['render', path('scene-good.json'), '-q', '-o', path('scene-good.json')], EXIT.usage, /refusing to overwrite the input/],
  ['a bake over an existing output from a bad input', bake('pcm8.wav', 'existing-out.wav'), EXIT.input, /8-bit/],
];

describe('ralenti command line under bad files', () => {
  it.each(cases)('refuses %s with a clear message and exit code', async (_what, argv, code, message) => {
    const r = await cli(argv);
    expect(r.code).toBe(code);
    expect(r.err).toMatch(message);
    expect(r.err).not.toMatch(/unexpected error|\n\s+at /); // a message, not a stack trace
    // No file damaged: every file of the folder keeps its bytes; no partial output appears.
    for (const [name, bytes] of Object.entries(files)) expect(readFileSync(path(name)).equals(bytes), name).toBe(true);
    const written = readdirSync(dir).filter((f) => /^o\d+\.wav$/.test(f));
    expect(written).toEqual([]);
  });

  it('still works on the good file afterwards (the checks above are not refusing everything)', async () => {
    const r = await cli(bake('good.wav', 'baked.wav'));
    expect(r.code).toBe(EXIT.ok);
    expect(existsSync(path('baked.wav'))).toBe(true);
    expect(readFileSync(path('good.wav')).equals(files['good.wav'])).toBe(true);
    rmSync(path('baked.wav'));
  });
});
