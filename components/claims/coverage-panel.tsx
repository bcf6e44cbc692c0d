import clsx from 'clsx';
import type { CoverageView } from '@/lib/services/filing';

const mark = { pass: '✓', fail: '✗', open: '?' } as const;

export function CoveragePanel({ coverage }: { coverage: CoverageView }) {
  if (coverage.status === 'incomplete') return <p className="text-sm text-ink-muted">{coverage.message}</p>;
  const a = coverage.assessment;
  const tone = a.covered === true ? 'text-charge-700' : a.covered === false ? 'text-fault-700' : 'text-volt-700';
  return (
    <div data-testid="coverage">
      <p className={clsx('text-lg font-bold', tone)}>
        {a.covered === true ? 'In coverage' : a.covered === false ? 'Out of coverage' : 'Coverage not yet decided'}
      </p>
      {a.covered !== true ? <p className="text-sm text-ink-soft">{a.summary}</p> : null}
      <ul className="mt-3 space-y-1 text-sm">
        {a.reasons.map((r) => (
          <li key={r.code} className="flex gap-2">
            <span className={clsx('w-4 shrink-0 font-bold', r.outcome === 'pass' ? 'text-charge-600' : r.outcome === 'fail' ? 'text-fault-500' : 'text-volt-500')} aria-label={r.outcome}>
              {mark[r.outcome]}
            </span>
            <span>{r.text}</span>
          </li>
        ))}
      </ul>
    </div>
  );
}
