import { HIST_BINS } from '../../metrics/radialHistogram';

/**
 * Add up interval histograms sent as text — bins separated by ',', intervals
 * by ';' (what aggregateSql.ts's string_agg returns) — into `acc`, bin by
 * bin. A hand-written scanner rather than split/map: a vessel-day is ~1,440
 * intervals, and the job reads hundreds of vessel-days at a time.
 * An empty interval histogram (n = 0) is an empty segment. Counts are
 * non-negative integers (the ingest contract); anything else means a corrupt
 * store and throws rather than being guessed at.
 */
export function addHistogramText(acc: Float64Array, text: string): Float64Array {
  let bin = 0;
  let value = 0;
  let digits = 0;
  const endBin = (at: number) => {
    if (digits === 0) throw new SyntaxError(`histogram text: empty bin at ${at}`);
    if (bin >= HIST_BINS) throw new RangeError(`histogram text: more than ${HIST_BINS} bins`);
    acc[bin]! += value;
    value = 0;
    digits = 0;
  };
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      value = value * 10 + (c - 48);
      digits++;
    } else if (c === 44 /* , */) {
      endBin(i);
      bin++;
    } else if (c === 59 /* ; */) {
      if (digits > 0 || bin > 0) endBin(i);
      bin = 0;
    } else {
      throw new SyntaxError(`histogram text: unexpected "${text[i]}" at ${i}`);
    }
  }
  if (digits > 0 || bin > 0) endBin(text.length);
  return acc;
}
