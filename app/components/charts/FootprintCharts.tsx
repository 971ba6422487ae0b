'use client';

import { Bar, BarChart, CartesianGrid, Label, ReferenceLine, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from 'recharts';
import type { RadialDistribution, TrackScatter } from '../../../lib/charts/footprint';
import { AXIS_INK, GRID, TONE_COLOUR } from '../../../lib/charts/palette';
import { tickNumber } from './ticks';

/** Draws the prepared footprint (lib/charts/footprint.ts): radial distribution and track scatter. */

const tick = { fill: AXIS_INK, fontSize: 12 };

export function RadialDistributionChart({ data, height = 260 }: { data: RadialDistribution; height?: number }) {
  return (
    <BarChart responsive style={{ width: '100%', height }} data={data.bars} margin={{ top: 12, right: 18, bottom: 30, left: 4 }} barCategoryGap={0} accessibilityLayer>
      <CartesianGrid stroke={GRID} vertical={false} />
      <XAxis dataKey="r" type="number" domain={data.x.domain} tick={tick} tickFormatter={tickNumber} stroke={AXIS_INK} allowDecimals>
        <Label value={data.x.label} position="insideBottom" offset={-22} fill={AXIS_INK} fontSize={12} />
      </XAxis>
      <YAxis domain={data.y.domain} width={58} tick={tick} tickFormatter={tickNumber} stroke={AXIS_INK}>
        <Label value={data.y.label} angle={-90} position="insideLeft" style={{ textAnchor: 'middle' }} fill={AXIS_INK} fontSize={12} />
      </YAxis>
      {data.refLines.map((r) => (
        <ReferenceLine key={r.label} x={r.y} stroke={TONE_COLOUR[r.tone]} strokeDasharray="6 4" label={{ value: r.label, position: 'insideTopRight', fill: TONE_COLOUR[r.tone], fontSize: 12 }} />
      ))}
      <Bar dataKey="pct" name="Share of samples" fill={TONE_COLOUR.primary} isAnimationActive={false} />
      <Tooltip
        labelFormatter={(_r, payload) => String(payload?.[0]?.payload?.label ?? '')}
        formatter={(value) => `${Number(value).toLocaleString('en-GB', { maximumFractionDigits: 2 })} %`}
      />
    </BarChart>
  );
}

const noMarker = () => <g />;

export function TrackScatterChart({ data, height = 320 }: { data: TrackScatter; height?: number }) {
  return (
    <ScatterChart responsive style={{ width: '100%', maxWidth: height + 80, height, margin: '0 auto' }} margin={{ top: 12, right: 18, bottom: 30, left: 4 }} accessibilityLayer>
      <CartesianGrid stroke={GRID} />
      <XAxis dataKey="east" type="number" domain={data.x.domain} tick={tick} tickFormatter={tickNumber} stroke={AXIS_INK} allowDataOverflow>
        <Label value={data.x.label} position="insideBottom" offset={-22} fill={AXIS_INK} fontSize={12} />
      </XAxis>
      <YAxis dataKey="north" type="number" domain={data.y.domain} width={58} tick={tick} tickFormatter={tickNumber} stroke={AXIS_INK} allowDataOverflow>
        <Label value={data.y.label} angle={-90} position="insideLeft" style={{ textAnchor: 'middle' }} fill={AXIS_INK} fontSize={12} />
      </YAxis>
      {data.circles.map((c) => (
        <Scatter key={c.label} name={c.label} data={c.points} line={{ stroke: TONE_COLOUR[c.tone], strokeDasharray: '6 4' }} shape={noMarker} isAnimationActive={false} />
      ))}
      <Scatter name="Position" data={data.points} fill={TONE_COLOUR.primary} fillOpacity={0.45} shape="circle" isAnimationActive={false} legendType="circle" />
      <Tooltip
        cursor={{ strokeDasharray: '3 3' }}
        formatter={(value, name) => [`${Number(value).toFixed(2)} m`, name === 'east' ? 'East' : name === 'north' ? 'North' : String(name)]}
      />
    </ScatterChart>
  );
}
