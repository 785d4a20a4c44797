import { describe, expect, it } from 'vitest';
import { browserSuiteMode } from './browser-harness';

describe('browser suite gating', () => {
  it.each([
    ['/bin/sh', {}, 'run'],
    ['/no/such/chromium', {}, 'skip'],
    ['/no/such/chromium', { CI: '' }, 'skip'],
    ['/no/such/chromium', { CI: 'true' }, 'fail'],
    ['/bin/sh', { CI: 'true' }, 'run'],
  ] as const)('with browser %s and env %j the suite is set to %s', (path, env, mode) => {
    expect(browserSuiteMode(path, env)).toBe(mode);
  });
});
