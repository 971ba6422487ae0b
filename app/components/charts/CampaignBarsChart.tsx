'use client';

import { Bar, BarChart, CartesianGrid, Label, Legend, Tooltip, XAxis, YAxis } from 'recharts';
import type { CampaignBars } from '../../../lib/charts/campaignChart';
import { AXIS_INK, GRID, TONE_COLOUR } from '../../../lib/charts/palette';
import { tickNumber } from './ticks';

/** Draws the prepared campaign bars (lib/charts/campaignChart.ts). */
export default function CampaignBarsChart({ data, height = 280 }: { data: CampaignBars; height?: number }) {
  return (
    <BarChart responsive style={{ width: '100%', height }} data={data.rows} margin={{ top: 12, right: 18, bottom: 30, left: 4 }} accessibilityLayer>
      <CartesianGrid stroke={GRID} vertical={false} />
      <XAxis dataKey="label" tick={{ fill: AXIS_INK, fontSize: 12 }} stroke={AXIS_INK} interval={0}>
        <Label value={data.xLabel} position="insideBottom" offset={-22} fill={AXIS_INK} fontSize={12} />
      </XAxis>
      <YAxis domain={data.y.domain} width={58} tick={{ fill: AXIS_INK, fontSize: 12 }} tickFormatter={tickNumber} stroke={AXIS_INK}>
        <Label value={data.y.label} angle={-90} position="insideLeft" style={{ textAnchor: 'middle' }} fill={AXIS_INK} fontSize={12} />
      </YAxis>
      {data.series.map((s) => (
        <Bar key={s.key} dataKey={s.key} name={s.label} fill={TONE_COLOUR[s.tone]} isAnimationActive={false} maxBarSize={36} />
      ))}
      <Tooltip formatter={(v) => (typeof v === 'number' ? `${v.toFixed(1)} %` : 'no DP samples')} />
      <Legend verticalAlign="top" height={28} iconSize={10} wrapperStyle={{ fontSize: 12 }} />
    </BarChart>
  );
}
