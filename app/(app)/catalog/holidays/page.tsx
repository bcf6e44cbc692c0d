import type { Metadata } from 'next';
import { HolidayForm, RemoveHolidayButton } from '@/components/catalog/holiday-forms';
import { requireRole } from '@/lib/auth/session';
import { DEADLINE_RULE_TEXT, isoWeekday, localDate, weekdayName } from '@/lib/calendar';
import { listHolidays } from '@/lib/db/catalog';
import { formatDay } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Holidays · Catalog' };

export default async function HolidaysPage() {
  const user = await requireRole('brand_admin');
  const today = localDate(new Date().toISOString(), user.timeZone);
  const days = await listHolidays(user.organisationId);
  const years = [...new Set(days.map((d) => d.day.slice(0, 4)))];
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <div className="space-y-4">
        {years.map((y) => (
          <section key={y} className="card overflow-hidden">
            <h2 className="bg-paper-sunk px-4 py-2 text-sm">{y}</h2>
            <ul data-testid={`holidays-${y}`}>
              {days.filter((d) => d.day.startsWith(y)).map((d) => (
                <li key={d.day} className={`flex items-center gap-4 border-t border-paper-line px-4 py-2 text-sm ${d.day < today ? 'text-ink-muted' : ''}`}>
                  <span className="figure w-28">{formatDay(d.day)}</span>
                  <span className="w-10 text-xs text-ink-muted">{weekdayName(isoWeekday(d.day)).slice(0, 3)}</span>
                  <span className="flex-1">{d.name}</span>
                  <RemoveHolidayButton day={d.day} name={d.name} />
                </li>
              ))}
            </ul>
          </section>
        ))}
        {years.length === 0 ? <p className="card p-6 text-ink-muted">No days off yet: deadlines count every weekday.</p> : null}
        <p className="text-xs text-ink-muted">{DEADLINE_RULE_TEXT}</p>
      </div>
      <section className="card self-start p-5">
        <h2 className="mb-4">Add a day off</h2>
        <HolidayForm />
      </section>
    </div>
  );
}
