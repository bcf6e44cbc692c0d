import clsx from 'clsx';
import type { TrackStep } from '@/lib/fulfilment/tracks';
import { formatDateTime, formatDay } from '@/lib/format/dates';

/** One track as a vertical line of steps: done ones filled, the current one ringed, the rest hollow. */
export function TrackSteps({ steps, timeZone, testId }: { steps: TrackStep[]; timeZone: string; testId: string }) {
  return (
    <ol className="space-y-3" data-testid={testId}>
      {steps.map((s, i) => (
        <li key={s.key} className="relative flex gap-3" data-state={s.state} data-step={s.key}>
          <div className="flex flex-col items-center">
            <span
              aria-hidden
              className={clsx(
                'mt-1 h-3.5 w-3.5 shrink-0 rounded-full border-2',
                s.state === 'done' && 'border-charge-600 bg-charge-600',
                s.state === 'current' && 'border-charge-600 bg-paper-raised ring-4 ring-charge-100',
                s.state === 'todo' && 'border-paper-line bg-paper-raised',
              )}
            />
            {i < steps.length - 1 ? <span aria-hidden className={clsx('mt-1 w-0.5 flex-1', s.state === 'done' ? 'bg-charge-300' : 'bg-paper-line')} /> : null}
          </div>
          <div className="min-w-0 pb-1">
            <p className={clsx('text-sm', s.state === 'todo' ? 'text-ink-muted' : 'font-bold', s.state === 'current' && 'text-charge-800')}>
              {s.label}
              {s.state === 'current' ? <span className="sr-only"> (now)</span> : null}
            </p>
            {s.at && s.state !== 'todo' ? <p className="text-xs text-ink-muted">{/^\d{4}-\d{2}-\d{2}$/.test(s.at) ? formatDay(s.at) : formatDateTime(s.at, timeZone)}</p> : null}
            {s.detail ? <p className="text-xs text-ink-soft">{s.detail}</p> : null}
          </div>
        </li>
      ))}
    </ol>
  );
}
