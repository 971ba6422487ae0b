import { describe, expect, it } from 'vitest';
import { emptyHistogram, mergeHistograms } from '../../metrics/radialHistogram';
import { addHistogramText } from './histogramText';

describe('addHistogramText', () => {
  it('adds intervals bin by bin, shorter ones padded with zeros', () => {
    const h = addHistogramText(emptyHistogram(), '1,2,3;10;0,0,0,7');
    expect(Array.from(h.slice(0, 5))).toEqual([11, 2, 3, 7, 0]);
  });

  it('agrees with mergeHistograms on random arrays, the overflow bin included', () => {
    const hists = Array.from({ length: 200 }, (_, i) =>
      Array.from({ length: 1 + ((i * 37) % 101) }, (_, k) => (i * 131 + k * 17) % 23),
    );
    const text = hists.map((h) => h.join(',')).join(';');
    expect(Array.from(addHistogramText(emptyHistogram(), text))).toEqual(Array.from(mergeHistograms(hists)));
  });

  it('reads an empty interval histogram as nothing', () => {
    expect(Array.from(addHistogramText(emptyHistogram(), '2;;3').slice(0, 2))).toEqual([5, 0]);
    expect(Array.from(addHistogramText(emptyHistogram(), '').slice(0, 2))).toEqual([0, 0]);
  });

  it.each([
    ['1,,2', /empty bin/],
    ['1,-2', /unexpected "-"/],
    ['1.5', /unexpected "\."/],
    [Array.from({ length: 102 }, () => '1').join(','), /more than 101 bins/],
  ])('refuses a corrupt text %#', (text, error) => {
    expect(() => addHistogramText(emptyHistogram(), text)).toThrow(error);
  });
});
