// The consumer test's set-up: packs the package as a user's machine would (from a copy of the repository in a folder
// whose path holds a space, '#', '%' and parentheses, with its dependencies hoisted one folder up as in a workspace), then
// makes fresh game projects that install the tarball with three and howler from the npm registry.
import { spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, readFileSync, readdirSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

/** The repository root. */
export const repo = resolve(__dirname, '../..');

/** npm's cache for these installs, kept between runs inside node_modules (a local cache dir, never the user's). */
export const npmCache = join(repo, 'node_modules', '.cache', 'ralenti-consumer-npm');

/** One set of game dependencies: the versions of three and howler (and their typings) a game installs. */
export interface GameVersions {
  name: string;
  three: string;
  howler: string;
  typesThree: string;
  typesHowler: string;
}

/** The supported versions: the current ones and one older minor of each (README "In a game"). */
export const versionMatrix: readonly GameVersions[] = Object.freeze([
  { name: 'current', three: '0.187.0', howler: '2.2.4', typesThree: '0.187.0', typesHowler: '2.2.13' },
  { name: 'older', three: '0.186.0', howler: '2.1.3', typesThree: '0.186.0', typesHowler: '2.2.13' },
]);

/** Runs a command (no shell), failing with its output when it exits non-zero. */
export function run(cmd: string, args: readonly string[], cwd: string, env: NodeJS.ProcessEnv = {}): SpawnSyncReturns<string> {
  const r = spawnSync(cmd, args, { cwd, encoding: 'utf8', env: { ...process.env, ...env }, maxBuffer: 64 << 20 });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} (in ${cwd}) exited ${r.status}\n${r.stdout}\n${r.stderr}`);
  return r;
}

/** Environment for npm: the local cache, no audit, no funding notes, no update check. */
export const npmEnv: NodeJS.ProcessEnv = {
  npm_config_cache: npmCache, npm_config_audit: 'false', npm_config_fund: 'false', npm_config_update_notifier: 'false',
  npm_config_loglevel: 'warn',
};

/** What packing produced. */
export interface Packed {
  tarball: string;
  tarballBytes: number;
  /** The build's output during prepack (it prints the entry sizes). */
  buildLog: string;
}

/**
 * Copies what the package build reads into `<work>/ws root/pkg #1 (50%)/` with node_modules linked at `<work>/ws root/`
 * (hoisted), runs `npm pack` there (prepack builds dist/) and resolves to the tarball. Each of these characters breaks a
 * `file://${path}` comparison; a backslash is left out because Node 20's ESM loader refuses any module whose POSIX path
 * holds one (ERR_INVALID_MODULE_SPECIFIER), and Windows separators are handled by pathToFileURL.
 */
export function packFromAwkwardPath(work: string): Packed {
  const ws = join(work, 'ws root');
  const pkg = join(ws, 'pkg #1 (50%)');
  mkdirSync(pkg, { recursive: true });
  symlinkSync(join(repo, 'node_modules'), join(ws, 'node_modules'), 'dir');
  for (const f of ['package.json', 'README.md', 'tsconfig.json', 'tsconfig.build.json']) cpSync(join(repo, f), join(pkg, f));
  for (const d of ['scripts', 'src', 'runtime', 'editor', 'wasm']) cpSync(join(repo, d), join(pkg, d), { recursive: true });
  const r = run('npm', ['pack', '--pack-destination', work], pkg, npmEnv);
  const name = readdirSync(work).find((f) => f.endsWith('.tgz'));
  if (!name) throw new Error(`npm pack wrote no tarball\n${r.stdout}\n${r.stderr}`);
  const tarball = join(work, name);
  return { tarball, tarballBytes: statSync(tarball).size, buildLog: `${r.stdout}\n${r.stderr}` };
}

/** The README's ```ts blocks that import `marker`, as game source text. */
export function readmeSnippet(marker: string): string {
  const readme = readFileSync(join(repo, 'README.md'), 'utf8');
  const block = readme.split('```ts\n').slice(1).map((b) => b.split('```')[0]).find((b) => b.includes(`from '${marker}'`));
  if (!block) throw new Error(`README has no ts block importing ${marker}`);
  return block;
}

/** Creates a game project in `dir`: the game's sources, the README snippets, and an npm install of the tarball. */
export function makeGame(dir: string, tarball: string, v: GameVersions): { installLog: string } {
  cpSync(join(__dirname, 'game'), dir, { recursive: true });
  writeFileSync(join(dir, 'src', 'readme-three-howler.ts'), readmeSnippet('ralenti/howler'));
  writeFileSync(join(dir, 'src', 'readme-web-audio.ts'), readmeSnippet('ralenti/runtime/inline'));
  writeFileSync(join(dir, 'package.json'), JSON.stringify({ name: `game-${v.name}`, private: true, type: 'module' }, null, 2));
  // tweakpane: the optional peer of the development-only `ralenti/editor` entry, as a designer installs it.
  const r = run('npm', ['install', '--no-save', '--prefer-offline', tarball, `three@${v.three}`, `howler@${v.howler}`,
    `@types/three@${v.typesThree}`, `@types/howler@${v.typesHowler}`, 'tweakpane@4.0.5'], dir, npmEnv);
  return { installLog: `${r.stdout}\n${r.stderr}` };
}

/** Bytes under `path` (files only, links not followed). */
export function folderBytes(path: string): number {
  const s = statSync(path);
  if (!s.isDirectory()) return s.size;
  return readdirSync(path).reduce((sum, f) => sum + folderBytes(join(path, f)), 0);
}

/** A mono 16-bit PCM WAV of `seconds` of a sine (RIFF WAVE layout, docs/references.md §15a). */
export function sineWav(frequency: number, sampleRate: number, seconds: number): Uint8Array {
  const frames = Math.round(sampleRate * seconds);
  const b = Buffer.alloc(44 + 2 * frames);
  b.write('RIFF', 0, 'latin1');
  b.writeUInt32LE(36 + 2 * frames, 4);
  b.write('WAVEfmt ', 8, 'latin1');
  b.writeUInt32LE(16, 16);
  b.writeUInt16LE(1, 20); // PCM
  b.writeUInt16LE(1, 22); // mono
  b.writeUInt32LE(sampleRate, 24);
  b.writeUInt32LE(2 * sampleRate, 28);
  b.writeUInt16LE(2, 32);
  b.writeUInt16LE(16, 34);
  b.write('data', 36, 'latin1');
  b.writeUInt32LE(2 * frames, 40);
  for (let i = 0; i < frames; i++) b.writeInt16LE(Math.round(16000 * Math.sin((2 * Math.PI * frequency * i) / sampleRate)), 44 + 2 * i);
  return b;
}

/** Whether `dir/node_modules/<name>` exists. */
export const installed = (dir: string, name: string) => existsSync(join(dir, 'node_modules', name));
