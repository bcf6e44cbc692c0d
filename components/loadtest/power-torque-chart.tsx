'use client';

import { CartesianGrid, ComposedChart, Legend, Line, ReferenceDot, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';
import { SMOOTHING_WINDOW_S } from '@/lib/loadtest/analysis-constants';
import type { ChartAxes, ChartRun } from '@/lib/loadtest-evidence';

// Before in amber, after in the proof green; power solid, torque dashed (tailwind.config.ts palette).
const COLOURS = { before: '#d99a0b', after: '#176646', grid: '#d9d4c8', ink: '#3a4246', limit: '#c2412d', minimum: '#626c71' };

type Props = {
  axes: ChartAxes;
  before: ChartRun | null;
  after: ChartRun | null;
  /** The legal class's speed limit in the speed unit (shown to brand staff). */
  legalLimit?: number | null;
  legalLabel?: string;
  /** The part's minimum wheel power in the power unit. */
  minPower?: number | null;
  /** Fixed size for the printable report; otherwise the chart follows its container. */
  width?: number;
  height?: number;
};

/**
 * Wheel power and torque against speed, before and after the repair, from the speed-binned curve
 * (a few dozen points however long the run), with each run's peaks marked.
 */
export function PowerTorqueChart({ axes, before, after, legalLimit, legalLabel, minPower, width, height = 340 }: Props) {
  const runs = [
    { key: 'before', label: 'Before', run: before, colour: COLOURS.before },
    { key: 'after', label: 'After', run: after, colour: COLOURS.after },
  ].filter((r): r is { key: string; label: string; run: ChartRun; colour: string } => r.run !== null);
  const fmtPower = (v: number) => v.toFixed(axes.powerDecimals);
  const sizing = width ? { width, height } : { responsive: true, style: { width: '100%', height } };
  const maxSpeed = Math.max(0, ...runs.flatMap((r) => r.run.points.map((p) => p.speed)), legalLimit ?? 0);

  return (
    <figure data-testid="power-torque-chart" data-points={runs.reduce((n, r) => n + r.run.points.length, 0)}>
      <ComposedChart {...sizing} margin={{ top: 16, right: 12, bottom: 8, left: 4 }} accessibilityLayer>
        <CartesianGrid stroke={COLOURS.grid} strokeDasharray="3 3" />
        <XAxis
          type="number"
          dataKey="speed"
          domain={[0, Math.ceil(maxSpeed + 1)]}
          allowDuplicatedCategory={false}
          tickCount={8}
          label={{ value: `Speed (${axes.speedUnit})`, position: 'insideBottom', offset: -4, fill: COLOURS.ink, fontSize: 12 }}
          height={40}
          stroke={COLOURS.ink}
          fontSize={12}
        />
        <YAxis yAxisId="power" stroke={COLOURS.ink} fontSize={12} tickFormatter={fmtPower} label={{ value: `Wheel power (${axes.powerUnit})`, angle: -90, position: 'insideLeft', fill: COLOURS.ink, fontSize: 12, style: { textAnchor: 'middle' } }} width={64} />
        <YAxis yAxisId="torque" orientation="right" stroke={COLOURS.ink} fontSize={12} label={{ value: `Wheel torque (${axes.torqueUnit})`, angle: 90, position: 'insideRight', fill: COLOURS.ink, fontSize: 12, style: { textAnchor: 'middle' } }} width={64} />
        <Tooltip
          formatter={(value, name) => {
            const n = typeof value === 'number' ? value : Number(value);
            return String(name).includes('power') ? `${fmtPower(n)} ${axes.powerUnit}` : `${n.toFixed(1)} ${axes.torqueUnit}`;
          }}
          labelFormatter={(v) => `${Number(v).toFixed(1)} ${axes.speedUnit}`}
        />
        <Legend verticalAlign="top" height={28} wrapperStyle={{ fontSize: 12 }} itemSorter={null} />
        {runs.map((r) => (
          <Line key={`${r.key}-power`} yAxisId="power" data={r.run.points} dataKey="power" name={`${r.label}: power`} stroke={r.colour} strokeWidth={2.5} dot={false} isAnimationActive={false} connectNulls />
        ))}
        {runs.map((r) => (
          <Line key={`${r.key}-torque`} yAxisId="torque" data={r.run.points} dataKey="torque" name={`${r.label}: torque`} stroke={r.colour} strokeWidth={1.75} strokeDasharray="6 4" dot={false} isAnimationActive={false} connectNulls />
        ))}
        {runs.map((r) => (
          <ReferenceDot key={`${r.key}-pp`} yAxisId="power" ifOverflow="extendDomain" x={r.run.peakPower.speed} y={r.run.peakPower.power} r={5} fill={r.colour} stroke="#fff" label={{ value: `${r.label} peak ${fmtPower(r.run.peakPower.power)} ${axes.powerUnit}`, position: 'top', fontSize: 11, fill: r.colour }} />
        ))}
        {runs.map((r) =>
          r.run.peakTorque ? (
            <ReferenceDot key={`${r.key}-pt`} yAxisId="torque" ifOverflow="extendDomain" x={r.run.peakTorque.speed} y={r.run.peakTorque.torque} r={4} fill="#fff" stroke={r.colour} strokeWidth={2} />
          ) : null,
        )}
        {minPower ? <ReferenceLine yAxisId="power" y={minPower} ifOverflow="extendDomain" stroke={COLOURS.minimum} strokeDasharray="2 4" label={{ value: 'Part minimum', position: 'insideTopLeft', fontSize: 11, fill: COLOURS.minimum }} /> : null}
        {legalLimit ? <ReferenceLine yAxisId="power" x={legalLimit} ifOverflow="extendDomain" stroke={COLOURS.limit} strokeDasharray="4 3" label={{ value: legalLabel ?? 'Class limit', position: 'insideBottomLeft', fontSize: 11, fill: COLOURS.limit }} /> : null}
      </ComposedChart>
      <figcaption className="mt-1 text-xs text-ink-muted">
        Mean of the samples in each {axes.speedUnit === 'mph' ? '1 mph' : '1 km/h'} speed step. Solid: power; dashed: torque. Filled dots mark peak power, rings peak torque (from the {SMOOTHING_WINDOW_S} s moving average).
      </figcaption>
    </figure>
  );
}
