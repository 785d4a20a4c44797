import { it } from 'vitest';
import { runCli } from '../cli/run-cli';
it('scratch', async () => {
  for (const f of ['flyby.json', 'recorded-flythrough.json', 'slow-motion.json']) {
    const t0 = performance.now();
    const r = await runCli(['check', 'runtime/offline/examples/' + f, '-q']);
    console.log('CLI', f, r.code, (performance.now() - t0).toFixed(0), 'ms\n', r.out, r.err);
  }
}, 300000);
