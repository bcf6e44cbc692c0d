import type { Metadata } from 'next';
import Link from 'next/link';
import { revalidatePath } from 'next/cache';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireUser } from '@/lib/auth/session';
import { listNotifications, markAllRead } from '@/lib/db/notifications';

export const metadata: Metadata = { title: 'Updates' };

async function markAllReadAction() {
  'use server';
  const user = await requireUser();
  await markAllRead(user.id);
  revalidatePath('/', 'layout');
}

export default async function NotificationsPage() {
  const user = await requireUser();
  const items = await listNotifications(user.id);
  const unread = items.some((n) => !n.readAt);
  return (
    <>
      <PageHeader
        title="Updates"
        lead="Everything that needs you: a claim submitted, more evidence asked for, a decision, a shipment. The same updates go to your e-mail."
        actions={
          unread ? (
            <form action={markAllReadAction}>
              <Button variant="secondary">Mark all read</Button>
            </form>
          ) : null
        }
      />
      {items.length === 0 ? (
        <EmptyState title="Nothing new">When a claim you work on moves and needs you, it will show up here.</EmptyState>
      ) : (
        <ul className="card divide-y divide-paper-line">
          {items.map((n) => (
            <li key={n.id} className={`flex gap-3 px-4 py-3 ${n.readAt ? '' : 'bg-charge-50/60'}`} data-testid="notification">
              <span className={`mt-2 h-2 w-2 shrink-0 rounded-full ${n.readAt ? 'bg-transparent' : 'bg-charge-500'}`} aria-hidden />
              <div className="min-w-0 flex-1">
                <p className="font-bold">{n.link ? <Link href={n.link} className="hover:underline">{n.title}</Link> : n.title}</p>
                <p className="text-sm text-ink-soft">{n.body}</p>
              </div>
              <time className="shrink-0 text-xs text-ink-muted" dateTime={n.createdAt.toISOString()}>
                {n.createdAt.toLocaleString('en-GB', { timeZone: user.timeZone, dateStyle: 'medium', timeStyle: 'short' })}
              </time>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
