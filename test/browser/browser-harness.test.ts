import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { browserSuiteMode } from './browser-harness';

// A stand-in browser file in a fresh temp folder, and a name beside it that does not exist.
const dir = mkdtempSync(join(tmpdir(), 'ralenti-harness-'));
const present = join(dir, 'chromium');
const absent = join(dir, 'no-such-chromium');
writeFileSync(present, '');
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('browser suite gating', () => {
  it.each([
    { state: 'present', path: present, env: {}, mode: 'run' },
    { state: 'absent', path: absent, env: {}, mode: 'skip' },
    { state: 'absent', path: absent, env: { CI: '' }, mode: 'skip' },
    { state: 'absent', path: absent, env: { CI: 'true' }, mode: 'fail' },
    { state: 'present', path: present, env: { CI: 'true' }, mode: 'run' },
  ] as const)('with the browser file $state and env $env the suite is set to $mode', ({ path, env, mode }) => {
    expect(browserSuiteMode(path, env)).toBe(mode);
  });
});
