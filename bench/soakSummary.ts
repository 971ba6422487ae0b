/** One reading of every soaked process's resident memory, MB, `atS` seconds into the run. */
export interface RssSample {
  atS: number;
  worker: number;
  web: number;
  jobs: number;
  demo: number;
}

export interface RssFigures {
  baselineMb: number;
  endMb: number;
  peakMb: number;
  growthPct: number;
}

type Process = Exclude<keyof RssSample, 'atS'>;
const PROCESSES: readonly Process[] = ['worker', 'web', 'jobs', 'demo'];

const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;

/**
 * RSS growth after warm-up, per process: the mean over the `windowS` seconds
 * after `warmupS` against the mean over the last `windowS` seconds. Means
 * over a window, not single readings: a garbage collection or a page render
 * moves one reading by tens of MB either way. (Common practice, no source.)
 */
export function soakSummary(samples: readonly RssSample[], warmupS: number, windowS: number): Record<Process, RssFigures> {
  const lastS = samples.at(-1)?.atS ?? 0;
  const base = samples.filter((s) => s.atS >= warmupS && s.atS <= warmupS + windowS);
  const end = samples.filter((s) => s.atS >= lastS - windowS);
  if (base.length === 0 || end.length === 0) throw new Error('soak: no samples after the warm-up');
  const out = {} as Record<Process, RssFigures>;
  for (const p of PROCESSES) {
    const baselineMb = mean(base.map((s) => s[p]));
    const endMb = mean(end.map((s) => s[p]));
    out[p] = { baselineMb, endMb, peakMb: Math.max(...samples.map((s) => s[p])), growthPct: ((endMb - baselineMb) / baselineMb) * 100 };
  }
  return out;
}
