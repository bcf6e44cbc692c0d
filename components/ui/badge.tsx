import clsx from 'clsx';
import type { ReactNode } from 'react';

type Tone = 'neutral' | 'charge' | 'volt' | 'fault' | 'cell';

const tones: Record<Tone, string> = {
  neutral: 'bg-paper-sunk text-ink-soft',
  charge: 'bg-charge-100 text-charge-800',
  volt: 'bg-volt-100 text-volt-700',
  fault: 'bg-fault-100 text-fault-700',
  cell: 'bg-cell-50 text-cell-700',
};

export function Badge({ tone = 'neutral', children, className }: { tone?: Tone; children: ReactNode; className?: string }) {
  return <span className={clsx('inline-flex items-center rounded px-2 py-0.5 text-xs font-bold', tones[tone], className)}>{children}</span>;
}
