import { isFastPath } from './detect';
import type { FlagSettings } from './config';
import type { Judgement } from './judge';
import type { WatchedSeries } from './series';

/**
 * The plain-language sentence stored with a flag, e.g.
 *   "Thruster AZ5 efficiency falling 0.9 %/day over 30 days (Sen's slope,
 *    95 % interval 0.6 to 1.2 %/day; 30 days with data); Mann–Kendall p = 0.0003."
 * Figures judged on the log scale (judge.ts) are turned back into the
 * figure's own terms: levels in its unit, rates in % a day. Counts (limit
 * events, rejections) are given in their own unit.
 */

function subjectTitle(subject: string): string {
  if (subject.startsWith('thruster:')) return `Thruster ${subject.slice(9)} `;
  if (subject.startsWith('ref:')) return `Reference system ${subject.slice(4)} `;
  return '';
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** 3 significant digits, a real minus sign; 0 for what is 0 to rounding. */
export function num(x: number): string {
  if (Math.abs(x) < 1e-9) return '0';
  const s = Math.abs(x) >= 1000 ? x.toFixed(0) : Math.abs(x) < 0.001 ? x.toExponential(2) : x.toPrecision(3).replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '');
  return s.replace('-', '−');
}

export function pValue(p: number): string {
  if (p < 0.0001) return 'p < 0.0001';
  return `p = ${Number(p.toPrecision(p < 0.001 ? 1 : 2))}`;
}

export function explain(subject: string, s: WatchedSeries, j: Judgement, settings: FlagSettings): string {
  const d = j.detection;
  const log = d.scale === 'log';
  const head = capitalise(`${subjectTitle(subject)}${s.label}`);
  const inUnit = (x: number) => {
    const v = num(log ? Math.exp(x) : x);
    return s.unit === '×' || s.unit === '°' ? `${v}${s.unit}` : `${v} ${s.unit}`;
  };
  /** Sizes of slopes a day, as the reader wants them: % a day on the log scale, the figure's units a day otherwise. */
  const rates = (...slopes: number[]) => slopes.map((x) => num(Math.abs(log ? 100 * Math.expm1(x) : x)));
  const perDay = log ? '%/day' : 'a day';
  const parts: string[] = [];
  const t = d.trend;
  const e = d.ewma;
  // The fast path leads with the CUSUM; a slow method that also holds then 'agrees'.
  const fast = isFastPath(d.path);
  const c = d.cusum;
  if (fast && c && c.now !== null) {
    const since = c.run === 1 ? 'today' : `${c.run} days ago`;
    const relative = log ? Math.expm1(c.now - c.target) : Math.abs(c.target) > 1e-12 ? (c.now - c.target) / c.target : null;
    const pct = relativeChange(relative);
    const k = c.confirm;
    const p = !k
      ? ''
      : k.test === 'rank_sum'
        ? `; its last ${k.days} days rank ${c.now > c.target ? 'above' : 'below'} the baseline's and the window's ${k.daysBefore} days before them (Wilcoxon–Mann–Whitney, ${pValue(k.p)})`
        : `; Mann–Kendall over ${settings.windowDays} days agrees, ${pValue(k.p)}`;
    parts.push(
      `${head} ${c.now > c.target ? 'up' : 'down'} to ${inUnit(c.now)} against a baseline of ${inUnit(c.target)}${pct}, ` +
        `a shift that began about ${since}: CUSUM at ${num(c.c / c.sigma)} σ, past its decision interval of ${num(c.h / c.sigma)} σ ` +
        `(Page's CUSUM, reference ${num(c.k / c.sigma)} σ, ${e?.baselineDays ?? 0} baseline days before the window)${p}.`,
    );
  }
  if (t?.holds && !fast) {
    const way = t.sen.slope > 0 ? 'rising' : 'falling';
    const [slope] = rates(t.sen.slope);
    const [a, b] = rates(t.sen.lower, t.sen.upper).sort((x, y) => Number(x.replace('−', '-')) - Number(y.replace('−', '-')));
    const p = s.direction === 'rising' ? t.mk.pIncreasing : t.mk.pDecreasing;
    parts.push(
      `${head} ${way} ${slope} ${perDay} over ${settings.windowDays} days ` +
        `(Sen's slope, ${Math.round(t.sen.confidence * 100)} % interval ${a} to ${b} ${perDay}; ${d.n} days with data); Mann–Kendall ${pValue(p)}.`,
    );
  }
  if (e?.holds) {
    const side = e.ewma > e.target ? 'above' : 'below';
    const relative = log ? Math.expm1(e.ewma - e.target) : Math.abs(e.target) > 1e-12 ? (e.ewma - e.target) / e.target : null;
    const pct = relativeChange(relative);
    const against = e.baselineDays > 0 ? `a baseline of ${inUnit(e.target)}` : `its healthy level ${inUnit(e.target)}`;
    const from = e.baselineDays > 0 ? `${e.baselineDays} baseline days before the window` : `no baseline yet, spread from day-to-day changes`;
    const sentence =
      `EWMA ${inUnit(e.ewma)} against ${against}${pct}, ${num(Math.abs(e.z))} σ ${side} it; ` +
      `control limit ${inUnit(e.limit)} (EWMA λ = ${settings.ewma.lambda}, L = ${settings.ewma.k}, ${from}).`;
    parts.push((t?.holds && !fast) || (fast && c?.now != null) ? `The EWMA chart agrees: ${sentence}` : `${head} ${side} its baseline: ${sentence}`);
  }
  if (j.weather) {
    const what = j.weather.beta2 === null ? "the wind's share" : "the share of the wind's strength and of its angle off the bow";
    parts.push(`Judged with ${what} removed (fitted on ${j.weather.baselineDays} baseline days).`);
  }
  const r = j.weatherRange;
  if (r && r.leftOut > 0) {
    parts.push(`${r.leftOut} ${r.leftOut === 1 ? 'day' : 'days'} of the window with a mean wind above ${num(r.maxWindMs)} m/s, more than the baseline saw, not judged.`);
  }
  return parts.join(' ');
}

/** " (+12.5 %)", or for a figure that has grown more than tenfold from a small baseline (limit events from 0.5 a day) " (×1440)". */
function relativeChange(relative: number | null): string {
  if (relative === null) return '';
  if (relative >= 9) return ` (×${num(1 + relative)})`;
  return ` (${relative > 0 ? '+' : '−'}${num(Math.abs(100 * relative))} %)`;
}
