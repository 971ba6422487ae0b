import { describe, expect, it } from 'vitest';
import { staleWhileRevalidate } from './memo';

describe('staleWhileRevalidate', () => {
  it('loads once, serves the cached value, then refreshes in the background after the TTL', async () => {
    let clock = 0;
    let loads = 0;
    let release: (() => void) | undefined;
    const get = staleWhileRevalidate(
      1000,
      async (key) => {
        loads++;
        if (loads > 1) await new Promise<void>((r) => (release = r));
        return `${key}#${loads}`;
      },
      () => clock,
    );
    expect(await get('day1')).toBe('day1#1');
    clock = 500;
    expect(await get('day1')).toBe('day1#1');
    expect(loads).toBe(1);
    clock = 1500;
    // Old value at once, one refresh started.
    expect(await get('day1')).toBe('day1#1');
    expect(await get('day1')).toBe('day1#1');
    expect(loads).toBe(2);
    release!();
    await new Promise((r) => setTimeout(r, 0));
    expect(await get('day1')).toBe('day1#2');
  });

  it('awaits a new key, and throws a failed first load', async () => {
    let fail = true;
    const get = staleWhileRevalidate(1000, async (key) => {
      if (fail) throw new Error('store down');
      return key;
    });
    await expect(get('a')).rejects.toThrow('store down');
    fail = false;
    expect(await get('a')).toBe('a');
    expect(await get('b')).toBe('b');
  });
});
