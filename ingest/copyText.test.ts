import { describe, expect, it } from 'vitest';
import { copyLine } from './copyText';

describe('copyLine', () => {
  // Source: PostgreSQL 16 documentation, COPY, "Text Format" — backslash
  // sequences \\, \t, \n, \r and \N for NULL.
  it('writes NULL, numbers, booleans and escaped text', () => {
    expect(copyLine([null, undefined, 1.5, -2e-7, true, false, 'a\tb\nc\\d\re'])).toBe(
      '\\N\t\\N\t1.5\t-2e-7\tt\tf\ta\\tb\\nc\\\\d\\re\n',
    );
  });

  it('passes PostgreSQL array literals through', () => {
    expect(copyLine(['{1,2,3}'])).toBe('{1,2,3}\n');
  });
});
