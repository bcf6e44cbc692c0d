'use client';

import { Bar, BarChart, CartesianGrid, Legend, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatMoney, type CurrencyCode } from '@/lib/money';

type Row = {
  key: string;
  partsCreditedMinor: number;
  laborMinor: number;
  freightMinor: number;
  chargebacksMinor: number;
  shippedPartsAtCostMinor: number;
};

// Our palette (tailwind.config.ts): charge greens for what is paid, volt for freight, fault for chargebacks.
const SERIES = [
  { key: 'shippedPartsAtCostMinor', label: 'Parts shipped (at cost)', color: '#13523a' },
  { key: 'partsCreditedMinor', label: 'Parts credited', color: '#3f9d72' },
  { key: 'laborMinor', label: 'Labor', color: '#a9d8bf' },
  { key: 'freightMinor', label: 'Freight', color: '#d99a0b' },
  { key: 'chargebacksMinor', label: 'Chargebacks', color: '#c2412d' },
] as const;

/** Warranty cost stacked by kind; amounts stay whole minor units, only the axis labels are rounded. */
export function CostChart({ rows, currency, labels }: { rows: Row[]; currency: string; labels?: Record<string, string> }) {
  const fmt = (v: number) => formatMoney(Math.round(v), currency as CurrencyCode);
  const data = rows.map((r) => ({ ...r, name: labels?.[r.key] ?? r.key }));
  return (
    <div className="h-80 w-full" data-testid="cost-chart">
      <ResponsiveContainer width="100%" height="100%">
        <BarChart data={data} stackOffset="sign" margin={{ top: 8, right: 16, bottom: 8, left: 24 }}>
          <CartesianGrid strokeDasharray="3 3" stroke="#d9d4c8" />
          <XAxis dataKey="name" tick={{ fontSize: 12, fill: '#3a4246' }} />
          <YAxis tickFormatter={fmt} tick={{ fontSize: 11, fill: '#626c71' }} width={90} />
          <Tooltip formatter={(v) => fmt(Number(v))} />
          <Legend wrapperStyle={{ fontSize: 12 }} />
          <ReferenceLine y={0} stroke="#1c2124" />
          {SERIES.map((s) => (
            <Bar key={s.key} dataKey={s.key} name={s.label} stackId="cost" fill={s.color} maxBarSize={72} isAnimationActive={false} />
          ))}
        </BarChart>
      </ResponsiveContainer>
    </div>
  );
}
