// Fuzzing the tool's outer boundaries: `ralenti` argument lists (verbs, options, values and file names mixed at
// random, run in a scratch folder) and raw dev-server requests (targets built from traversal pieces, methods, Host
// headers). Every run ends with a documented exit code or status, no input changes, and nothing outside the build
// folder is ever served.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { mkdtempSync, mkdirSync, readFileSync, readdirSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { connect } from 'node:net';
import { writeWav } from '../../runtime/offline';
import { runCli } from '../runtime/cli/run-cli';
// @ts-expect-error plain ES module without type declarations
import { serveStatic } from '../../scripts/static-server.mjs';
import { fuzz } from './fuzz-harness';

const dir = mkdtempSync(join(tmpdir(), 'ralenti-fuzz-'));
const SECRET = 'fuzz-secret-outside-9d1e';
const inputs: Record<string, Buffer> = {};
const home = process.cwd();

beforeAll(() => {
  const x = new Float32Array(2400).map((_, i) => 0.5 * Math.sin(i / 7));
  inputs['good.wav'] = Buffer.from(writeWav({ sampleRate: 48000, channels: [x, x], encoding: 'pcm16' }));
  inputs['bad.wav'] = Buffer.from('RIFF....WAVEfmt nope');
  inputs['scene.json'] = Buffer.from(JSON.stringify({ version: 1, duration: 0.1, sounds: { t: { type: 'tone', frequency: 440, seconds: 0.1 }, f: { type: 'file', path: 'good.wav' } }, voices: [{ sound: 't' }, { sound: 'f' }] }));
  for (const [n, b] of Object.entries(inputs)) writeFileSync(join(dir, n), b);
  mkdirSync(join(dir, 'folder'));
  symlinkSync(join(dir, 'good.wav'), join(dir, 'link.wav'));
  // Relative output names land in the scratch folder, never in the repository.
  process.chdir(dir);
});

afterAll(() => {
  process.chdir(home);
  rmSync(dir, { recursive: true, force: true });
});

const word = fc.constantFrom(
  'render', 'bake', 'check', 'help', '--help', '-h', 'frobnicate',
  '--speed', '--speed=0.5', '-o', '--output', '--tier', '--encoding', '--rate', '--gain', '--normalize', '-q', '--quiet', '--report', '--tolerance-cents', '--', '-', '-x', '--unknown',
  '0.5', '4', '1.7', '0', '-1', '1e9', 'NaN', '', 'abc', '44100.5', '8000', 'pcm16', 'float32', 'high', 'draft', '-6',
  'good.wav', 'bad.wav', 'scene.json', 'link.wav', 'folder', 'missing.wav', 'out.wav', 'out2.wav', 'report.svg', 'folder/out.wav', './good.wav',
);

const file = fc.constantFrom('good.wav', 'good.wav', 'scene.json', 'scene.json', 'bad.wav', 'link.wav', 'folder', 'missing.wav');
const output = fc.constantFrom('out.wav', 'out.wav', 'out2.wav', 'good.wav', 'link.wav', 'folder', 'folder/out.wav', 'no-folder/out.wav');
const pairs = {
  tier: fc.tuple(fc.constant('--tier'), fc.constantFrom('draft', 'standard', 'high', 'best')),
  encoding: fc.tuple(fc.constant('--encoding'), fc.constantFrom('pcm16', 'pcm24', 'float32', 'pcm8')),
  rate: fc.tuple(fc.constant('--rate'), fc.constantFrom('8000', '22050', '44100.5', '7999')),
  gain: fc.tuple(fc.constant('--gain'), fc.constantFrom('-6', '0', '12', '61', 'NaN')),
  normalize: fc.constant(['--normalize']),
  quiet: fc.constant(['-q']),
  report: fc.tuple(fc.constant('--report'), fc.constantFrom('report.svg', 'report.html', 'report.txt', 'scene.json')),
  tolerance: fc.tuple(fc.constant('--tolerance-cents'), fc.constantFrom('5', '0', '1200')),
  junk: fc.tuple(word),
};
const speed = fc.constantFrom('0.5', '2', '1.7', '0.01', '5', 'abc');
/** Mostly well-shaped commands of each verb (its own options, values valid or not), some word lists at random. */
const argvArb = fc.oneof(
  { weight: 2, arbitrary: fc.tuple(file, speed, output, fc.array(fc.oneof(pairs.tier, pairs.encoding, pairs.gain, pairs.normalize, pairs.quiet), { maxLength: 3 })).map(([f, v, o, p]) => ['bake', f, '--speed', v, '-o', o, ...p.flat()]) },
  { weight: 2, arbitrary: fc.tuple(file, output, fc.array(fc.oneof(pairs.tier, pairs.encoding, pairs.rate, pairs.gain, pairs.normalize, pairs.quiet), { maxLength: 3 })).map(([f, o, p]) => ['render', f, '-o', o, ...p.flat()]) },
  { weight: 1, arbitrary: fc.tuple(file, fc.array(fc.oneof(pairs.rate, pairs.report, pairs.tolerance, pairs.quiet), { maxLength: 3 })).map(([f, p]) => ['check', f, ...p.flat()]) },
  { weight: 1, arbitrary: fc.tuple(fc.constantFrom('bake', 'render', 'check'), file, fc.array(fc.oneof(...Object.values(pairs)), { maxLength: 4 })).map(([v, f, p]) => [v, f, ...p.flat()]) },
  { weight: 1, arbitrary: fc.array(word, { minLength: 0, maxLength: 8 }) },
);

describe('fuzz: the tool boundaries', () => {
  it('ralenti arguments: 150 random argument lists end with a documented exit code and damage no input', async () => {
    const codes = new Map<number, number>();
    const c = await fuzz('CLI arguments and files', argvArb, 150, 1805, async (argv) => {
      const r = await runCli(argv);
      codes.set(r.code, (codes.get(r.code) ?? 0) + 1);
      if (![0, 1, 2, 3, 4].includes(r.code)) return `exit code ${r.code}`;
      if (/unexpected error/.test(r.err)) return r.err.slice(0, 300);
      for (const [n, b] of Object.entries(inputs)) if (!readFileSync(join(dir, n)).equals(b)) return `${n} changed`;
      const parts = readdirSync(dir).filter((f) => f.endsWith('.part'));
      if (parts.length > 0) return `temporary files left: ${parts.join(', ')}`;
    });
    console.log(`[fuzz] CLI exit codes: ${JSON.stringify(Object.fromEntries([...codes].sort()))}`);
    expect(c.failures).toBe(0);
  }, 120_000);

  it('dev server: 300 random requests get 200/400/404/405/421 and never the outside file', async () => {
    const root = join(dir, 'build');
    mkdirSync(join(root, 'assets'), { recursive: true });
    writeFileSync(join(root, 'index.html'), '<p>scene</p>');
    writeFileSync(join(root, 'assets', 'app.js'), 'export {};');
    writeFileSync(join(dir, 'secret.txt'), SECRET);
    symlinkSync(join(dir, 'secret.txt'), join(root, 'assets', 'linked.txt'));
    symlinkSync(dir, join(root, 'up'));
    const served = await serveStatic({ root, port: 0 });
    const port: number = served.port;
    const piece = fc.oneof(
      fc.constantFrom('..', '.', '%2e%2e', '%252e%252e', '%2e', 'assets', 'index.html', 'app.js', 'secret.txt', 'up', 'linked.txt', '%00', '\\', '%5c', 'C:', '', '%2f', '%c0%ae', '?x=1', '#y', '%', '%zz'),
      fc.stringMatching(/^[A-Za-z0-9._~%-]{1,8}$/),
    );
    const request = fc.record({
      target: fc.tuple(fc.constantFrom('/', '//', '', 'http://127.0.0.1/', '*'), fc.array(piece, { maxLength: 6 })).map(([head, parts]) => head + parts.join('/')),
      method: fc.constantFrom('GET', 'GET', 'GET', 'HEAD', 'POST', 'OPTIONS', 'DELETE'),
      host: fc.constantFrom(`127.0.0.1:${port}`, `127.0.0.1:${port}`, `localhost:${port}`, 'evil.example', `127.0.0.1`, ''),
    });
    const ask = (r: { target: string; method: string; host: string }) =>
      new Promise<{ status: number; body: string }>((done) => {
        const socket = connect(port, '127.0.0.1', () => socket.write(`${r.method} ${r.target || '/'} HTTP/1.1\r\nHost: ${r.host}\r\nConnection: close\r\n\r\n`));
        let text = '';
        socket.setTimeout(10_000, () => socket.destroy());
        socket.on('data', (d) => (text += d.toString('latin1')));
        socket.on('close', () => done({ status: Number(text.split(' ')[1]), body: text }));
        socket.on('error', () => {});
      });
    try {
      const c = await fuzz('dev-server requests', request, 300, 1806, async (r) => {
        const a = await ask(r);
        if (a.body.includes(SECRET)) return `served the outside file (status ${a.status})`;
        if (![200, 400, 404, 405, 421].includes(a.status)) return `status ${a.status}`;
      });
      expect(c.failures).toBe(0);
      expect((await ask({ target: '/', method: 'GET', host: `127.0.0.1:${port}` })).status).toBe(200);
    } finally {
      await served.close();
    }
  }, 120_000);
});
