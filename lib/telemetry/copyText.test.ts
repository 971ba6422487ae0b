import { describe, expect, it } from 'vitest';
import { copyArray, copyBoolean, copyNumber, copyText } from './copyText';

describe('COPY text fields', () => {
  // Source: PostgreSQL 16 documentation, COPY, "Text Format" — backslash
  // sequences \\, \t, \n, \r and \N for NULL.
  it('writes NULL, numbers, booleans and escaped text', () => {
    expect([copyNumber(undefined), copyBoolean(undefined), copyArray(undefined)]).toEqual(['\\N', '\\N', '\\N']);
    expect([copyNumber(1.5), copyNumber(-2e-7), copyNumber(1e21), copyNumber(-0)]).toEqual(['1.5', '-2e-7', '1e+21', '0']);
    expect([copyBoolean(true), copyBoolean(false)]).toEqual(['t', 'f']);
    expect(copyText('a\tb\nc\\d\re')).toBe('a\\tb\\nc\\\\d\\re');
    expect(copyText('T1')).toBe('T1');
  });

  it('writes PostgreSQL array literals', () => {
    expect(copyArray([1, 2, 3])).toBe('{1,2,3}');
    expect(copyArray([])).toBe('{}');
  });
});
