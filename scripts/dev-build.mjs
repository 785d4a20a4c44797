// Builds the sample scene (esbuild) and the worklet (scripts/build-worklet.mjs) into build/, once or watching.
import * as esbuild from 'esbuild';
import { copyFile, mkdir } from 'node:fs/promises';
import { existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const repo = resolve(dirname(fileURLToPath(import.meta.url)), '..');

/** Default build folder (the only folder the dev server serves). */
export const defaultOutdir = join(repo, 'build');

/** Builds the worklet through buildWorklet when scripts/build-worklet.mjs exists; returns false otherwise. */
async function buildWorkletIfPresent(outdir, log) {
  const helper = join(repo, 'scripts', 'build-worklet.mjs');
  if (!existsSync(helper)) {
    log('worklet: scripts/build-worklet.mjs is not there yet; the scene runs without audio');
    return false;
  }
  try {
    // A fresh URL each time so that edits to the helper itself are picked up on rebuild.
    const mod = await import(pathToFileURL(helper).href + `?t=${Date.now()}`);
    await mod.buildWorklet({ outdir, minify: false });
    return true;
  } catch (err) {
    log(`worklet build failed: ${err?.message ?? err}`);
    return false;
  }
}

/** Copies the page and its style sheet (watched through the scene's own rebuilds). */
async function copyStatic(outdir) {
  await copyFile(join(repo, 'sample-scene', 'index.html'), join(outdir, 'index.html'));
  await copyFile(join(repo, 'sample-scene', 'scene.css'), join(outdir, 'app.css'));
}

/**
 * Builds build/index.html, build/app.js (+ app.css) and build/ralenti-processor.js.
 * With watch: true, keeps an esbuild context watching and rebuilds everything on change;
 * resolves to { dispose() } in both cases.
 */
export async function buildScene({ outdir = defaultOutdir, watch = false, log = console.log, minify = false } = {}) {
  await mkdir(outdir, { recursive: true });
  await copyStatic(outdir);
  let first = true;
  let firstBuilt;
  const firstBuild = new Promise((done) => (firstBuilt = done));
  const rebuildNotice = {
    name: 'ralenti-rebuild',
    setup(build) {
      build.onEnd(async (result) => {
        await copyStatic(outdir);
        await buildWorkletIfPresent(outdir, log);
        const errors = result.errors.length;
        if (!first || errors) log(errors ? `scene build: ${errors} error(s)` : 'scene rebuilt');
        first = false;
        firstBuilt();
      });
    },
  };
  const options = {
    entryPoints: { app: join(repo, 'sample-scene', 'main.ts') },
    bundle: true,
    format: 'esm',
    target: 'es2022',
    outdir,
    sourcemap: true,
    minify,
    logLevel: 'warning',
    plugins: [rebuildNotice],
  };
  if (!watch) {
    await esbuild.build(options);
    return { dispose: async () => {} };
  }
  const ctx = await esbuild.context(options);
  // watch() starts with a build of its own: wait for that one instead of building twice.
  await ctx.watch();
  await firstBuild;
  return { dispose: () => ctx.dispose() };
}
