// An unexpected exception inside the check is an internal error (exit 5), never "check failed" (exit 1).
import { describe, expect, it, vi } from 'vitest';
import { resolve } from 'node:path';
import { runCli } from './run-cli';

vi.mock('../../../runtime/check', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../../runtime/check')>();
  return {
    ...real,
    checkScene: () => {
      throw new TypeError('a bug in the checker');
    },
  };
});

describe('ralenti check internal errors', () => {
  it('exits 5 with the message when the check itself throws', async () => {
    const r = await runCli(['check', resolve(__dirname, '../../../runtime/offline/examples/flyby.json'), '-q']);
    expect(r.code).toBe(5);
    expect(r.err).toMatch(/internal error while checking: TypeError: a bug in the checker/);
    expect(r.out).toBe('');
  });
});
