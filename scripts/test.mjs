// Runs the type checks and every vitest suite, then prints the plain "N passed, N failed" line CI reads.
import { spawnSync } from 'node:child_process';
import { readFileSync, rmSync, existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { buildWasm } from './build-wasm.mjs';

/** A package's program, found by module resolution (so hoisted dependencies in a workspace are found too). */
function program(pkg) {
  const manifest = createRequire(import.meta.url).resolve(`${pkg}/package.json`);
  const { bin } = JSON.parse(readFileSync(manifest, 'utf8'));
  return join(dirname(manifest), typeof bin === 'string' ? bin : bin[pkg === 'typescript' ? 'tsc' : pkg]);
}

const extra = process.argv.slice(2);
let failed = 0;
let passed = 0;

// The WebAssembly kernel's generated module must exist before type checks and suites import it.
await buildWasm();

function run(cmd, args) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', shell: false });
  return r.status === 0;
}

for (const project of ['tsconfig.json', 'tsconfig.core.json']) {
  console.log(`\n# type check (${project})`);
  if (run(process.execPath, [program('typescript'), '--noEmit', '-p', project])) passed += 1;
  else failed += 1;
}

const report = '.vitest-report.json';
rmSync(report, { force: true });
console.log('\n# vitest');
run(process.execPath, [program('vitest'), 'run', '--reporter=default', '--reporter=json', `--outputFile=${report}`, ...extra]);
if (existsSync(report)) {
  const r = JSON.parse(readFileSync(report, 'utf8'));
  passed += r.numPassedTests;
  failed += r.numFailedTests;
  // A suite that fails to load has no tests counted; count it as one failure.
  for (const f of r.testResults ?? []) {
    if (f.status === 'failed' && (f.assertionResults ?? []).length === 0) failed += 1;
  }
} else {
  console.error('vitest wrote no report');
  failed += 1;
}
console.log(`\n${passed} passed, ${failed} failed`);
process.exit(failed === 0 && passed > 0 ? 0 : 1);
