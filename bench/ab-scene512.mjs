// Same-process A/B timing of the 512-voice scene (bench/scene512.ts) between two checkouts of the repository: each
// checkout's scene is bundled with esbuild (as scripts/bench.mjs does) and both are loaded into this one process, then
// rendered in alternating slices timed by processor time (process.cpuUsage). Prints B ÷ A as the median of the slice
// pairs with its quartiles, and first the output hash of each (the same blocks, the same call pattern).
// Not part of `npm run bench` or `npm test`. An A/A control: pass one checkout twice (two bundles, two module instances).
//   node bench/ab-scene512.mjs <checkout A> <checkout B> [--pairs 200] [--blocks 24] [--hash-blocks 1200] [--b-first]
//   node bench/ab-scene512.mjs <checkout> --only [--warm 375] [--blocks 150]   (one build, for callgrind: warm, then render)
import { build } from 'esbuild';
import { mkdtempSync, rmSync, existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

const args = process.argv.slice(2);
const opt = (name, d) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? Number(args[i + 1]) : d;
};
// Checkouts: the words that are neither a flag nor the value of one.
const valued = new Set(['--pairs', '--blocks', '--hash-blocks', '--warm']);
const roots = args.filter((a, i) => !a.startsWith('--') && !valued.has(args[i - 1])).map((r) => resolve(r));

async function load(root, tag) {
  const { buildWasm } = await import(pathToFileURL(join(root, 'scripts', 'build-wasm.mjs')).href);
  await buildWasm({ log: () => {} });
  // Under the checkout's node_modules/ (or this one's) so that package imports resolve.
  const nm = existsSync(join(root, 'node_modules')) ? join(root, 'node_modules') : resolve('node_modules');
  const dir = mkdtempSync(join(nm, '.ralenti-ab-'));
  const outfile = join(dir, `scene-${tag}.mjs`);
  await build({ entryPoints: [join(root, 'bench', 'scene512.ts')], outfile, bundle: true, platform: 'node', format: 'esm', target: 'node20', packages: 'external', logLevel: 'error' });
  const mod = await import(pathToFileURL(outfile).href);
  rmSync(dir, { recursive: true, force: true });
  return mod;
}

const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
const q = (s, f) => s[Math.min(s.length - 1, Math.floor(f * (s.length - 1) + 0.5))];

if (args.includes('--only')) {
  const m = await load(roots[0], 'only');
  const s = m.createScene512('propagation');
  s.render(opt('warm', 375));
  const t0 = cpuMs();
  s.render(opt('blocks', 150));
  console.log(`rendered ${opt('blocks', 150)} blocks after ${opt('warm', 375)}: ${(cpuMs() - t0).toFixed(0)} ms processor time`);
} else {
  const [ra, rb] = roots;
  const A = await load(ra, 'a');
  const B = await load(rb, 'b');
  const hashBlocks = opt('hash-blocks', 1200);
  const blocks = opt('blocks', 24);
  const ha = A.createScene512('propagation', true);
  const hb = B.createScene512('propagation', true);
  for (let k = 0; k < hashBlocks; k += blocks) {
    ha.render(blocks);
    hb.render(blocks);
  }
  console.log(`output hash over ${hashBlocks} blocks: A ${ha.hash.toString(16)}  B ${hb.hash.toString(16)}  ${ha.hash === hb.hash ? 'equal' : 'DIFFERENT'}`);
  const sa = A.createScene512('propagation');
  const sb = B.createScene512('propagation');
  sa.render(375);
  sb.render(375);
  const slice = (s) => {
    const t0 = cpuMs();
    s.render(blocks);
    return cpuMs() - t0;
  };
  for (let k = 0; k < 20; k++) {
    slice(sa);
    slice(sb);
  }
  const bFirst = args.includes('--b-first');
  const ratios = [];
  let ta = 0;
  let tb = 0;
  for (let k = 0; k < opt('pairs', 200); k++) {
    let a;
    let b;
    if (bFirst) {
      b = slice(sb);
      a = slice(sa);
    } else {
      a = slice(sa);
      b = slice(sb);
    }
    ta += a;
    tb += b;
    ratios.push(b / a);
  }
  ratios.sort((x, y) => x - y);
  const audio = (ratios.length * blocks * 128) / 48000;
  console.log(`B ÷ A processor time, median [quartiles] of ${ratios.length} slice pairs of ${blocks} blocks (${bFirst ? 'B' : 'A'} first): ×${q(ratios, 0.5).toFixed(3)} [${q(ratios, 0.25).toFixed(3)}–${q(ratios, 0.75).toFixed(3)}]`);
  console.log(`share of a core: A ${((100 * ta) / 1000 / audio).toFixed(1)} %, B ${((100 * tb) / 1000 / audio).toFixed(1)} %`);
}
