// The package as a game gets it: `npm pack` (from an awkward path with hoisted dependencies), a fresh game project per
// supported three/howler version that installs the tarball from the registry, then everything a game does with it —
// Node imports of every entry, strict type checks under three module resolutions, esbuild and Vite builds, the built
// game in headless Chromium with a real AudioContext, and the `ralenti` program as installed.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createRequire } from 'node:module';
import { build as esbuild } from 'esbuild';
import { build as viteBuild } from 'vite';
import { chromium, type Browser } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH, browserSuiteMode } from '../browser/browser-harness';
// @ts-expect-error: plain ESM script without declarations
import { serveStatic } from '../../scripts/static-server.mjs';
import { folderBytes, installed, makeGame, npmEnv, packFromAwkwardPath, repo, run, sineWav, versionMatrix, type Packed } from './consumer-setup';
import { ENGINE_HAS_PROPAGATION } from '../runtime/check/engine-switch';

const work = mkdtempSync(join(tmpdir(), 'ralenti-consumer-'));
const www = join(work, 'www');
const gameDir = (name: string) => join(work, `game ${name}`);
const tsc = join(createRequire(__filename).resolve('typescript/package.json'), '..', 'bin', 'tsc');
const figures: Record<string, number | string> = {};
let packed: Packed;
const mode = browserSuiteMode();
/** Builds made from each game: esbuild for every version set, Vite for the current one. */
const builds = [...versionMatrix.map((v) => ({ bundler: 'esbuild', versions: v.name })), { bundler: 'vite', versions: 'current' }];

beforeAll(() => {
  packed = packFromAwkwardPath(work);
  for (const v of versionMatrix) makeGame(gameDir(v.name), packed.tarball, v);
  figures.tarballKiB = +(packed.tarballBytes / 1024).toFixed(1);
  figures.installedKiB = +(folderBytes(join(gameDir('current'), 'node_modules', 'ralenti')) / 1024).toFixed(1);
  figures.withDependenciesKiB = +((folderBytes(join(gameDir('current'), 'node_modules', 'ralenti')) + folderBytes(join(gameDir('current'), 'node_modules', 'fft.js'))) / 1024).toFixed(1);
}, 900_000);

afterAll(() => {
  // The figures the closing note asks for (install size, bundle sizes, click to audio), for the log.
  console.log(`consumer figures: ${JSON.stringify(figures)}`);
  // RALENTI_KEEP_CONSUMER=1 keeps the packed tarball, the games and their builds for a look by hand.
  if (process.env.RALENTI_KEEP_CONSUMER) console.log(`consumer work folder kept: ${work}`);
  else rmSync(work, { recursive: true, force: true });
});

describe('the packed tarball, installed in a fresh game', () => {
  it("builds from a path with a space, '#' and '%', dependencies hoisted, and prints every entry size", () => {
    expect(packed.tarballBytes).toBeGreaterThan(0);
    const sizes = packed.buildLog.match(/^\| (\S+) \| [\d.]+ \| ([\d.]+) \|$/gm) ?? [];
    expect(sizes.length).toBe(Object.keys(JSON.parse(readFileSync(join(repo, 'package.json'), 'utf8')).exports).filter((k) => !k.endsWith('.json')).length);
    for (const row of sizes) figures[`gzipKiB ${row.split('|')[1].trim()}`] = Number(row.split('|')[3]);
  });

  it('ships a manifest with no install script and takes three and howler from the game (no nested copies)', () => {
    const dir = gameDir('current');
    const pkg = JSON.parse(readFileSync(join(dir, 'node_modules', 'ralenti', 'package.json'), 'utf8'));
    for (const s of ['preinstall', 'install', 'postinstall', 'prepare']) expect(pkg.scripts?.[s], s).toBeUndefined();
    expect(existsSync(join(dir, 'node_modules', 'ralenti', 'node_modules'))).toBe(false);
    for (const p of ['three', 'howler', 'fft.js']) expect(installed(dir, p), p).toBe(true);
  });

  it('imports every exports entry in Node (the processor file is resolved and syntax-checked: it runs in a worklet)', () => {
    const script = `
      const pkg = (await import('ralenti/package.json', { with: { type: 'json' } })).default;
      const out = {};
      for (const key of Object.keys(pkg.exports)) {
        const spec = 'ralenti' + key.slice(1);
        if (key.endsWith('.json')) out[key] = typeof (await import(spec, { with: { type: 'json' } })).default;
        else if (key.endsWith('processor.js')) out[key] = import.meta.resolve(spec);
        else out[key] = Object.keys(await import(spec)).length;
      }
      console.log(JSON.stringify(out));`;
    const dir = gameDir('current');
    writeFileSync(join(dir, 'entries.mjs'), script);
    const out = JSON.parse(run(process.execPath, ['entries.mjs'], dir).stdout) as Record<string, number | string>;
    const keys = Object.keys(JSON.parse(readFileSync(join(dir, 'node_modules', 'ralenti', 'package.json'), 'utf8')).exports);
    expect(Object.keys(out).sort()).toEqual(keys.sort());
    for (const [k, v] of Object.entries(out)) {
      if (k.endsWith('processor.js')) run(process.execPath, ['--check', fileURLToPath(v as string)], dir);
      else if (typeof v === 'number') expect(v, k).toBeGreaterThan(0);
      else expect(v, k).toBe('object');
    }
  });

  it.each(versionMatrix.flatMap((v) => (v.name === 'current' ? ['bundler', 'node16', 'nodenext'] : ['bundler']).map((r) => [v.name, r])))(
    'type-checks the game (%s versions) with strict under moduleResolution %s, without skipLibCheck',
    (name, resolution) => {
      run(process.execPath, [tsc, '-p', `tsconfig.${resolution}.json`], gameDir(name));
    },
  );

  it.each(builds.map((b) => [b.bundler, b.versions]))('builds the game with %s (%s versions)', async (bundler, versions) => {
    const dir = gameDir(versions);
    const out = join(www, `${bundler}-${versions}`);
    if (bundler === 'esbuild') {
      await esbuild({
        entryPoints: [join(dir, 'src', 'main.ts')], bundle: true, minify: true, format: 'esm', platform: 'browser',
        target: 'es2022', outdir: out, absWorkingDir: dir, logLevel: 'error',
      });
      writeFileSync(join(out, 'index.html'), readFileSync(join(dir, 'index.html'), 'utf8').replace('./src/main.ts', './main.js'));
      // esbuild leaves new URL('./ralenti-processor.js', import.meta.url) as written: the game copies the file beside its bundle (docs/guide.md).
      copyFileSync(join(dir, 'node_modules', 'ralenti', 'dist', 'ralenti-processor.js'), join(out, 'ralenti-processor.js'));
    } else {
      await viteBuild({ root: dir, base: './', configFile: false, logLevel: 'error', build: { outDir: out, emptyOutDir: true } });
    }
    mkdirSync(join(out, 'sounds'), { recursive: true });
    // A 2.000 s loop of 440 Hz at 44.1 kHz (880 whole cycles); served under howler's .ogg/.mp3 names too (decoders sniff the bytes).
    const wav = sineWav(440, 44100, 2);
    for (const f of ['rotor.wav', 'rotor.ogg', 'rotor.mp3']) writeFileSync(join(out, 'sounds', f), wav);
    expect(existsSync(join(out, 'index.html'))).toBe(true);
  }, 300_000);

  it.each(['--version', 'render', 'bake', 'check'])('runs `npx ralenti %s` from the installed package', (verb) => {
    const dir = gameDir('current');
    const examples = join('node_modules', 'ralenti', 'runtime', 'offline', 'examples');
    writeFileSync(join(dir, 'tone.wav'), sineWav(440, 44100, 0.5));
    const args: Record<string, string[]> = {
      '--version': ['--version'],
      render: ['render', join(examples, 'flyby.json'), '-o', 'flyby out.wav', '-q'],
      bake: ['bake', 'tone.wav', '--speed', '0.5', '-o', 'tone slow.wav', '-q'],
      check: ['check', join(examples, 'flyby.json'), '-q'],
    };
    if (verb === 'check') {
      // A check exits with its verdict; today's default engine fails the fly-by (docs/checker.md, engine-switch.ts).
      const c = spawnSync('npx', ['--no-install', 'ralenti', ...args.check], { cwd: dir, encoding: 'utf8', env: { ...process.env, ...npmEnv } });
      expect(c.stderr).toBe('');
      expect(c.stdout).toMatch(/^judged an offline re-render of the script$/m);
      expect(c.status).toBe(ENGINE_HAS_PROPAGATION ? 0 : 1);
      return;
    }
    const r = run('npx', ['--no-install', 'ralenti', ...args[verb]], dir, npmEnv);
    if (verb === '--version') expect(r.stdout.trim()).toBe(JSON.parse(readFileSync(join(repo, 'package.json'), 'utf8')).version);
    else expect(r.stderr).toBe('');
    if (verb === 'bake') expect(readFileSync(join(dir, 'tone slow.wav')).length).toBeGreaterThan(44 + 2 * 44100 * 0.9);
  }, 120_000);
});

describe.skipIf(mode === 'skip')('the built game in headless Chromium', () => {
  let browser: Browser;
  let served: { url: string; close(): Promise<void> };
  beforeAll(async () => {
    if (mode === 'fail') throw new Error(`Chromium is missing at ${CHROMIUM_PATH} (CI installs it in .ci/run)`);
    served = await serveStatic({ root: www, port: 0 });
    browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
  }, 120_000);
  afterAll(async () => {
    await browser?.close();
    await served?.close();
  });

  /** Opens a build's page in `mode`, clicks start, and resolves to the game's report and console errors. */
  async function play(build: string, gameMode: string) {
    const context = await browser.newContext();
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('console', (m) => m.type() === 'error' && errors.push(`${m.text()} (${m.location().url})`));
    page.on('pageerror', (e) => errors.push(String(e)));
    await page.goto(`${served.url}${build}/index.html?mode=${gameMode}`);
    await page.click('#start');
    await page.waitForFunction(() => (window as unknown as { game?: { done: boolean } }).game?.done === true, null, { timeout: 30_000 });
    const report = await page.evaluate(() => (window as unknown as { game: { error: string | null; values: Record<string, number> } }).game);
    await context.close();
    return { ...report, errors };
  }

  const cents = (a: number, b: number) => 1200 * Math.log2(a / b);

  it.each(builds.flatMap((b) => [[`${b.bundler}-${b.versions}`, 'howler'], [`${b.bundler}-${b.versions}`, 'plain']]))(
    'plays the %s build (%s snippet): slow motion lowers the heard pitch, Doppler raises it, no console error',
    async (build, gameMode) => {
      const r = await play(build, gameMode);
      expect(r.error).toBeNull();
      expect(r.errors).toEqual([]);
      const v = r.values;
      // The loop is 440 Hz; a still source at time scale 1 plays it at ratio 1.
      expect(Math.abs(cents(v.still, 440))).toBeLessThan(5);
      expect(Math.abs(cents(v.stillAgain, 440))).toBeLessThan(5);
      // 'vehicles' follows time with the identity pitch curve (built-in tuning): ratio = time scale after the ramp.
      // 5 cents: about the smallest audible pitch change (docs/references.md §10).
      expect(Math.abs(cents(v.slow, 440 * v.slowScale))).toBeLessThan(5);
      if (gameMode === 'howler') {
        // Straight approach along the line of sight: f' = f · c / (c − v), moving-source Doppler (docs/references.md §1).
        expect(Math.abs(cents(v.moving, (440 * v.speedOfSound) / (v.speedOfSound - v.approachSpeed)))).toBeLessThan(5);
      } else {
        expect(cents(v.moving, 440)).toBeGreaterThan(50); // the siren's pass approaches: up by ~150 cents
      }
      figures[`clickToAudioMs ${build} ${gameMode}`] = Math.round(v.clickToAudioMs);
      expect(v.clickToAudioMs).toBeGreaterThan(0);
    },
    60_000,
  );

  it('decodes a 2.000 s loop at 44.1 kHz at its own rate in a 48 kHz context: 88200 frames (the browser alone resamples to 96000)', async () => {
    const r = await play('vite-current', 'decode');
    expect(r.error).toBeNull();
    expect(r.errors).toEqual([]);
    expect(r.values.contextRate).toBe(48000);
    expect(r.values.browserDecodeFrames).toBe(96000);
    expect([r.values.ownFrames, r.values.ownRate]).toEqual([88200, 44100]);
    expect([r.values.bridgeFrames, r.values.bridgeRate, r.values.bridgeContextRate]).toEqual([88200, 44100, 48000]);
    figures['startMs (createRalenti)'] = Math.round(r.values.startMs);
    figures['loadMs (2 s WAV)'] = Math.round(r.values.loadMs);
  }, 60_000);
});
