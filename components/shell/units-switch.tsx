'use client';

import clsx from 'clsx';
import { useOptimistic, useTransition } from 'react';
import { setUnitsAction } from '@/app/(app)/actions';

const OPTIONS = [
  { value: 'metric', label: 'km/h · N·m', title: 'Metric: km/h, N·m, W, kg, °C' },
  { value: 'imperial', label: 'mph · lbf·ft', title: 'Imperial: mph, lbf·ft, hp, lb, °F' },
] as const;

export function UnitsSwitch({ units }: { units: 'metric' | 'imperial' }) {
  const [shown, setShown] = useOptimistic(units);
  const [, start] = useTransition();
  return (
    <div role="group" aria-label="Units" className="flex rounded-md border border-paper/20 p-0.5 text-xs">
      {OPTIONS.map((o) => (
        <button
          key={o.value}
          type="button"
          title={o.title}
          aria-pressed={shown === o.value}
          onClick={() =>
            start(async () => {
              setShown(o.value);
              await setUnitsAction(o.value);
            })
          }
          className={clsx('rounded px-2 py-1 font-mono', shown === o.value ? 'bg-paper text-ink' : 'text-paper/70 hover:text-paper')}
        >
          {o.label}
        </button>
      ))}
    </div>
  );
}
