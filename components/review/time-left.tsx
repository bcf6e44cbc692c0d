import clsx from 'clsx';
import type { ClockStatus } from '@/lib/calendar';
import { formatDay } from '@/lib/format/dates';

type Clock = { dueDate: string; businessDaysLeft: number; status: ClockStatus; isPaused: boolean };

const days = (n: number) => `${n} business day${n === 1 ? '' : 's'}`;

/** "3 business days left", "Due today", "2 business days late", "Paused": the words for a review clock. */
export function timeLeftText(c: Clock): string {
  if (c.status === 'overdue') return `${days(Math.max(1, -c.businessDaysLeft))} late`;
  if (c.isPaused) return 'Paused: the dealer’s turn';
  if (c.businessDaysLeft === 0) return 'Due today';
  return `${days(c.businessDaysLeft)} left`;
}

const TONE: Record<string, string> = {
  overdue: 'bg-fault-100 text-fault-700',
  due_soon: 'bg-volt-100 text-volt-700',
  paused: 'bg-paper-sunk text-ink-soft',
  on_track: 'bg-charge-100 text-charge-800',
};

/** The time left on a review deadline, with the due date; overdue stands out. */
export function TimeLeft({ clock, compact }: { clock: Clock; compact?: boolean }) {
  return (
    <span className="inline-flex flex-col">
      <span className={clsx('inline-flex w-fit items-center rounded px-2 py-0.5 text-xs font-bold', TONE[clock.status] ?? TONE.on_track)} data-status={clock.status}>
        {clock.status === 'overdue' ? '⚠ ' : ''}
        {timeLeftText(clock)}
      </span>
      <span className={clsx('text-xs text-ink-muted', compact && 'sr-only')}>
        {clock.isPaused ? 'if it restarted today: ' : clock.status === 'overdue' ? 'was due ' : 'due '}
        {formatDay(clock.dueDate)}
      </span>
    </span>
  );
}
