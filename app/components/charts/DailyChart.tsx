'use client';

import { Bar, CartesianGrid, ComposedChart, Label, Legend, Line, ReferenceArea, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';
import { shortDay, longDay } from '../../../lib/charts/days';
import { AXIS_INK, BAND_FILL, GRID, TONE_COLOUR } from '../../../lib/charts/palette';
import type { DailyChartData } from '../../../lib/charts/types';
import { tickNumber } from './ticks';

/**
 * Draws a prepared daily chart (lib/charts/dailyChart.ts) with recharts.
 * No decisions here: days, gaps (null values, never joined across),
 * axis ranges, labels and reference lines all come with the data.
 */

const formatValue = (value: unknown, unit: string) =>
  typeof value === 'number' ? `${value.toLocaleString('en-GB', { maximumFractionDigits: 2 })} ${unit}` : 'no figure';

export default function DailyChart({ chart, height = 260 }: { chart: DailyChartData; height?: number }) {
  const unitOf = new Map(chart.series.map((s) => [s.key, s.unit]));
  return (
    <ComposedChart
      responsive
      style={{ width: '100%', height }}
      data={chart.rows}
      margin={{ top: 12, right: chart.right ? 4 : 18, bottom: 30, left: 4 }}
      accessibilityLayer
    >
      <CartesianGrid stroke={GRID} vertical={false} />
      <XAxis dataKey="day" tickFormatter={shortDay} minTickGap={28} tick={{ fill: AXIS_INK, fontSize: 12 }} stroke={AXIS_INK}>
        <Label value={chart.xLabel} position="insideBottom" offset={-22} fill={AXIS_INK} fontSize={12} />
      </XAxis>
      <YAxis yAxisId="left" domain={chart.left.domain} width={58} tick={{ fill: AXIS_INK, fontSize: 12 }} tickFormatter={tickNumber} stroke={AXIS_INK} allowDataOverflow>
        <Label value={chart.left.label} angle={-90} position="insideLeft" style={{ textAnchor: 'middle' }} fill={AXIS_INK} fontSize={12} />
      </YAxis>
      {chart.right ? (
        <YAxis yAxisId="right" orientation="right" domain={chart.right.domain} width={58} tick={{ fill: AXIS_INK, fontSize: 12 }} tickFormatter={tickNumber} stroke={AXIS_INK}>
          <Label value={chart.right.label} angle={90} position="insideRight" style={{ textAnchor: 'middle' }} fill={AXIS_INK} fontSize={12} />
        </YAxis>
      ) : null}
      {chart.bands.map((b) => (
        <ReferenceArea key={`${b.from}-${b.to}`} yAxisId="left" x1={b.from} x2={b.to} fill={BAND_FILL} fillOpacity={0.55} label={{ value: b.label, position: 'insideTop', fill: AXIS_INK, fontSize: 12 }} />
      ))}
      {chart.refLines.map((r) => (
        <ReferenceLine
          key={`${r.label}-${r.y}`}
          yAxisId={r.axis ?? 'left'}
          y={r.y}
          stroke={TONE_COLOUR[r.tone]}
          strokeDasharray="6 4"
          label={{ value: r.label, position: 'insideTopRight', fill: TONE_COLOUR[r.tone], fontSize: 12 }}
        />
      ))}
      {chart.series.map((s) =>
        s.kind === 'bar' ? (
          <Bar key={s.key} yAxisId={s.axis ?? 'left'} dataKey={s.key} name={s.label} fill={TONE_COLOUR[s.tone]} isAnimationActive={false} maxBarSize={14} />
        ) : (
          <Line
            key={s.key}
            yAxisId={s.axis ?? 'left'}
            type="linear"
            dataKey={s.key}
            name={s.label}
            stroke={TONE_COLOUR[s.tone]}
            strokeWidth={2}
            strokeDasharray={s.dashed ? '5 3' : undefined}
            dot={{ r: 1.8, strokeWidth: 0, fill: TONE_COLOUR[s.tone] }}
            connectNulls={false}
            isAnimationActive={false}
          />
        ),
      )}
      <Tooltip
        labelFormatter={(day) => longDay(String(day))}
        formatter={(value, _name, item) => formatValue(value, unitOf.get(String(item.dataKey)) ?? '')}
      />
      <Legend verticalAlign="top" height={28} iconSize={10} wrapperStyle={{ fontSize: 12 }} />
    </ComposedChart>
  );
}
