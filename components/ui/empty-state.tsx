import type { ReactNode } from 'react';

export function EmptyState({ title, children, action }: { title: string; children: ReactNode; action?: ReactNode }) {
  return (
    <div className="card flex flex-col items-start gap-3 border-dashed px-6 py-10">
      <LoadCurveMark />
      <h2>{title}</h2>
      <div className="max-w-xl text-ink-muted">{children}</div>
      {action}
    </div>
  );
}

function LoadCurveMark() {
  return (
    <svg width="48" height="28" viewBox="0 0 48 28" aria-hidden className="text-charge-400">
      <path d="M2 26 C 10 4, 18 2, 26 6 S 40 20, 46 24" fill="none" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
      <path d="M2 26 H46" stroke="currentColor" strokeOpacity="0.35" strokeWidth="1.5" />
    </svg>
  );
}
