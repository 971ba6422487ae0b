import { sparkline } from '../../lib/charts/sparkline';
import { TONE_COLOUR } from '../../lib/charts/palette';

/**
 * A 30-day trend in a table cell, as plain SVG from the server (see
 * lib/charts/sparkline.ts for why not a chart component). The text beside
 * it carries the figure; the SVG is labelled for screen readers.
 */
export default function Sparkline({ values, reference, label }: { values: (number | null)[]; reference: number | null; label: string }) {
  const s = sparkline(values, { reference, width: 84 });
  return (
    <svg className="spark" width={s.width} height={s.height} viewBox={`0 0 ${s.width} ${s.height}`} role="img" aria-label={label}>
      {s.referenceY !== null ? <line x1={0} x2={s.width} y1={s.referenceY} y2={s.referenceY} stroke={TONE_COLOUR.warning} strokeDasharray="3 2" strokeWidth={1} /> : null}
      {s.path ? <path d={s.path} fill="none" stroke={TONE_COLOUR.primary} strokeWidth={1.5} strokeLinejoin="round" /> : null}
      {s.dots.map((d) => (
        <circle key={`${d.x}-${d.y}`} cx={d.x} cy={d.y} r={1.6} fill={TONE_COLOUR.primary} />
      ))}
    </svg>
  );
}
