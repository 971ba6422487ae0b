import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';

/**
 * The whole project type-checks under `strict`. `next build` in the browser
 * test skips its own type check, so this is where a type error fails CI.
 */
describe('TypeScript', () => {
  it('finds no type errors (tsc --noEmit, strict)', () => {
    const result = spawnSync(process.execPath, ['node_modules/typescript/bin/tsc', '--noEmit', '-p', '.'], {
      encoding: 'utf8',
    });
    expect(result.stdout + result.stderr).toBe('');
    expect(result.status).toBe(0);
  }, 120_000);
});
