import clsx from 'clsx';
import type { ReactNode } from 'react';

type Tone = 'info' | 'success' | 'warning' | 'danger';

const tones: Record<Tone, string> = {
  info: 'border-cell-500/30 bg-cell-50 text-cell-700',
  success: 'border-charge-300 bg-charge-50 text-charge-800',
  warning: 'border-volt-300 bg-volt-50 text-volt-700',
  danger: 'border-fault-500/40 bg-fault-50 text-fault-700',
};

export function Notice({ tone = 'info', title, children, className }: { tone?: Tone; title?: string; children?: ReactNode; className?: string }) {
  return (
    <div role={tone === 'danger' ? 'alert' : 'status'} className={clsx('rounded-md border px-4 py-3 text-sm', tones[tone], className)}>
      {title ? <p className="font-bold">{title}</p> : null}
      {children ? <div className={clsx(title && 'mt-1')}>{children}</div> : null}
    </div>
  );
}
