import clsx from 'clsx';
import { Badge } from '@/components/ui/badge';
import { MOTOR_POWER_THRESHOLD_W, POWER_BAND_FRACTION, type BatteryAnalysis, type ConditionsComparison, type DynoAnalysis, type TestConditions } from '@/lib/loadtest';
import type { RunVerdict } from '@/lib/loadtest-evidence';
import { formatLength, formatMass, formatPower, formatPressure, formatSpeed, formatTemperature, formatTorque, type UnitSystem } from '@/lib/units';
import { signedPct } from '@/lib/format/percent';


export function VerdictBadge({ verdict }: { verdict: RunVerdict }) {
  if (verdict.kind === 'no-spec') return <Badge tone="neutral">No spec to check against</Badge>;
  if (verdict.meets) return <Badge tone="charge">Meets the part’s spec</Badge>;
  if (verdict.kind === 'dyno') {
    const below = [verdict.check.power, verdict.check.torque].flatMap((v) => (v.status === 'below' ? [v.belowByPct] : []));
    return <Badge tone="fault">{below.length ? `Below spec by ${Math.max(...below).toFixed(1)} %` : 'Not measured against spec'}</Badge>;
  }
  return <Badge tone="fault">{verdict.check.status === 'below' ? `Below the threshold by ${verdict.check.belowByPoints.toFixed(1)} points` : 'Below the threshold'}</Badge>;
}

type Row = { label: string; before?: string; after?: string; change?: string; hint?: string; /** Words, not a figure. */ text?: boolean };

function FiguresTable({ rows, columns }: { rows: Row[]; columns: ('before' | 'after')[] }) {
  const both = columns.length === 2;
  return (
    <table className="w-full text-sm" data-testid="figures-table">
      <thead>
        <tr className="text-left text-xs uppercase tracking-wide text-ink-muted">
          <th className="py-1 pr-3 font-bold">Figure</th>
          {columns.map((c) => (
            <th key={c} className="py-1 pr-3 text-right font-bold">{c === 'before' ? 'Before repair' : 'After repair'}</th>
          ))}
          {both ? <th className="py-1 text-right font-bold">Change</th> : null}
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.label} className="border-t border-paper-line">
            <td className="py-1.5 pr-3">
              {r.label}
              {r.hint ? <span className="block text-xs text-ink-muted">{r.hint}</span> : null}
            </td>
            {columns.map((c) => (
              <td key={c} className={clsx('py-1.5 pr-3 text-right', r.text ? 'text-ink-soft' : 'figure')}>{r[c] ?? '—'}</td>
            ))}
            {both ? <td className="figure whitespace-nowrap py-1.5 text-right">{r.change ?? ''}</td> : null}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

const change = (b: number | null | undefined, a: number | null | undefined) =>
  b === null || b === undefined || a === null || a === undefined || b === 0 ? '' : signedPct(((a - b) / b) * 100);

/** Peaks, top speed and power band of one or two dyno runs, in the reader's units. */
export function DynoFigures({ before, after, units }: { before: DynoAnalysis | null; after: DynoAnalysis | null; units: UnitSystem }) {
  const columns = [...(before ? ['before' as const] : []), ...(after ? ['after' as const] : [])];
  const at = (p: { speedMs: number } | null | undefined) => (p ? ` at ${formatSpeed(p.speedMs, units).text}` : '');
  const band = (a: DynoAnalysis) => (a.powerBand ? `${formatSpeed(a.powerBand.fromMs, units).text} – ${formatSpeed(a.powerBand.toMs, units).text}` : '—');
  const cell = (f: (a: DynoAnalysis) => string) => ({ ...(before ? { before: f(before) } : {}), ...(after ? { after: f(after) } : {}) });
  const rows: Row[] = [
    { label: 'Peak wheel power', ...cell((a) => `${formatPower(a.peakPower.watts, units).text}${at(a.peakPower)}`), change: change(before?.peakPower.watts, after?.peakPower.watts) },
    {
      label: 'Peak wheel torque',
      ...cell((a) => (a.peakTorque ? `${formatTorque(a.peakTorque.nm, units).text}${at(a.peakTorque)}` : '—')),
      change: change(before?.peakTorque?.nm, after?.peakTorque?.nm),
    },
    { label: 'Top speed', ...cell((a) => formatSpeed(a.topSpeed.speedMs, units).text), change: change(before?.topSpeed.speedMs, after?.topSpeed.speedMs) },
    {
      label: 'Top speed under motor power',
      hint: `Samples with more than ${MOTOR_POWER_THRESHOLD_W} W at the wheel.`,
      ...cell((a) => (a.topSpeedUnderPower ? formatSpeed(a.topSpeedUnderPower.speedMs, units).text : '—')),
    },
    { label: 'Power band', hint: `Speed range at or above ${POWER_BAND_FRACTION * 100} % of peak power.`, ...cell(band) },
    {
      label: 'Power and torque',
      text: true,
      ...cell((a) => `${a.basis.power === 'reported' ? 'power measured' : 'power from torque'}, ${a.basis.torque === 'reported' ? 'torque measured' : 'torque from power'}`),
    },
    { label: 'Samples', ...cell((a) => `${a.sampleCount.toLocaleString('en')} over ${a.durationS.toFixed(1)} s`) },
    { label: 'Wheel circumference used', ...cell((a) => formatLength(a.circumferenceM, units).text) },
  ];
  return <FiguresTable rows={rows} columns={columns} />;
}

/** Delivered capacity and health of one or two discharges. */
export function BatteryFigures({ before, after }: { before: BatteryAnalysis | null; after: BatteryAnalysis | null }) {
  const columns = [...(before ? ['before' as const] : []), ...(after ? ['after' as const] : [])];
  const cell = (f: (a: BatteryAnalysis) => string) => ({ ...(before ? { before: f(before) } : {}), ...(after ? { after: f(after) } : {}) });
  const ir = (a: BatteryAnalysis) => (a.internalResistance ? `${(a.internalResistance.ohms * 1000).toFixed(0)} mΩ` : 'not measured');
  const rows: Row[] = [
    { label: 'Delivered charge', ...cell((a) => `${a.deliveredAh.toFixed(2)} Ah`), change: change(before?.deliveredAh, after?.deliveredAh) },
    { label: 'Delivered energy', ...cell((a) => `${a.deliveredWh.toFixed(0)} Wh`), change: change(before?.deliveredWh, after?.deliveredWh) },
    { label: 'State of health', hint: 'Delivered ÷ rated capacity.', ...cell((a) => `${a.stateOfHealthPct.toFixed(1)} % of ${a.ratedCapacityAh} Ah`) },
    {
      label: 'Internal resistance',
      hint: 'ΔV ÷ ΔI across the largest current step.',
      ...cell((a) => (a.internalResistance ? `${ir(a)} (${a.internalResistance.fromA.toFixed(1)} → ${a.internalResistance.toA.toFixed(1)} A, line ${a.internalResistance.row})` : ir(a))),
    },
    { label: 'Voltage start → end (lowest)', ...cell((a) => `${a.startVoltageV.toFixed(2)} → ${a.endVoltageV.toFixed(2)} V (${a.minVoltageV.toFixed(2)} V)`) },
    { label: 'Mean current', ...cell((a) => `${a.meanCurrentA.toFixed(2)} A over ${(a.durationS / 60).toFixed(0)} min`) },
    { label: 'Rated energy', hint: 'Nominal voltage × rated capacity; decides how the battery ships.', ...cell((a) => (a.ratedEnergyWh === null ? '—' : `${a.ratedEnergyWh.toFixed(1)} Wh`)) },
  ];
  return <FiguresTable rows={rows} columns={columns} />;
}

/** One run's recorded conditions, in the reader's units. */
export function conditionRows(c: TestConditions, units: UnitSystem, kind: 'dyno' | 'battery'): { label: string; value: string }[] {
  const v = <T,>(x: T | null | undefined, f: (x: T) => string) => (x === null || x === undefined || x === '' ? 'not recorded' : f(x));
  const rows = [{ label: 'Battery charge at start', value: v(c.batterySocStartPct, (x) => `${x.toFixed(0)} %`) }];
  if (kind === 'dyno') {
    rows.push(
      { label: 'Tyre size', value: v(c.tyreSize, (x) => x) },
      { label: 'Tyre pressure (sidewall maximum)', value: `${v(c.tyrePressurePa, (x) => formatPressure(x, units).text)} (${v(c.tyreMaxPressurePa, (x) => formatPressure(x, units).text)})` },
      { label: 'Measured circumference', value: v(c.measuredCircumferenceMm, (x) => formatLength(x / 1000, units).text) },
      { label: 'Dyno / roller', value: `${v(c.dynoId, (x) => x)} / ${v(c.rollerId, (x) => x)}` },
      { label: 'Rider or load', value: v(c.loadKg, (x) => formatMass(x, units).text) },
    );
  }
  rows.push({ label: 'Room temperature', value: v(c.ambientTempC, (x) => formatTemperature(x, units).text) });
  if (c.notes) rows.push({ label: 'Notes', value: c.notes });
  return rows;
}

export function ConditionsList({ conditions, units, kind }: { conditions: TestConditions; units: UnitSystem; kind: 'dyno' | 'battery' }) {
  return (
    <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2">
      {conditionRows(conditions, units, kind).map((r) => (
        <div key={r.label} className="flex justify-between gap-3 border-b border-paper-line py-1">
          <dt className="text-ink-muted">{r.label}</dt>
          <dd className={clsx('text-right', r.value.startsWith('not recorded') && 'text-ink-faint')}>{r.value}</dd>
        </div>
      ))}
    </dl>
  );
}

/** Whether before and after were run alike, and what differs when they were not. */
export function ConditionsVerdict({ comparison }: { comparison: ConditionsComparison }) {
  return (
    <div data-testid="conditions-verdict" data-comparable={comparison.comparable}>
      {comparison.comparable ? (
        <p className="text-sm text-charge-700">
          <span className="font-bold">Comparable:</span> the recorded test conditions of the two runs match within the usual tolerances.
        </p>
      ) : (
        <div className="text-sm text-fault-700">
          <p className="font-bold">Not comparable: the two runs were done under different conditions.</p>
          <ul className="mt-1 list-disc space-y-0.5 pl-5">
            {comparison.differences.map((d) => (
              <li key={d}>{d}</li>
            ))}
          </ul>
        </div>
      )}
      {comparison.advice.length ? (
        <ul className="mt-2 list-disc space-y-0.5 pl-5 text-sm text-volt-700">
          {comparison.advice.map((a) => (
            <li key={a}>{a}</li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
