import { describe, expect, it } from 'vitest';
import { csvField, toCsv } from './csv';
import { flattenRecords } from './flatten';

describe('csv (RFC 4180 section 2)', () => {
  it('quotes fields with a comma, a double quote, CR or LF, doubling the quotes', () => {
    // Source: RFC 4180 section 2, rules 5–7.
    expect(csvField('plain text')).toBe('plain text');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('line\nbreak')).toBe('"line\nbreak"');
    expect(csvField('carriage\rreturn')).toBe('"carriage\rreturn"');
    expect(csvField(' kept ')).toBe(' kept ');
  });

  it('writes null as the empty field, numbers exactly, booleans as words', () => {
    expect(csvField(null)).toBe('');
    expect(csvField(undefined)).toBe('');
    expect(csvField(0)).toBe('0');
    expect(csvField(0.1 + 0.2)).toBe('0.30000000000000004');
    expect(csvField(-1e-7)).toBe('-1e-7');
    expect(csvField(Number.NaN)).toBe('');
    expect(csvField(true)).toBe('true');
  });

  it('ends every record, the header included, with CRLF', () => {
    expect(toCsv(['a', 'b'], [[1, null], ['x', false]])).toBe('a,b\r\n1,\r\nx,false\r\n');
    expect(toCsv(['a'], [])).toBe('a\r\n');
  });
});

describe('flattenRecords', () => {
  it('spreads within_pct over one column per limit: configured ∪ present, in numeric order', () => {
    const table = flattenRecords(
      [
        { day: 'd1', within_pct: { '10': 100, '3': 90 } },
        { day: 'd2', within_pct: { '2.5': 80 } },
        { day: 'd3', within_pct: {} },
      ],
      ['day', 'within_pct'],
      { within_pct: ['3', '5'] },
    );
    expect(table.header).toEqual(['day', 'within_pct_2.5', 'within_pct_3', 'within_pct_5', 'within_pct_10']);
    expect(table.rows).toEqual([
      ['d1', null, 90, null, 100],
      ['d2', 80, null, null, null],
      ['d3', null, null, null, null],
    ]);
  });

  it('takes columns in the given order and ignores fields not listed', () => {
    expect(flattenRecords([{ b: 2, a: 1, extra: 3 }], ['a', 'b'])).toEqual({ header: ['a', 'b'], rows: [[1, 2]] });
  });
});
