import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { EmptyState } from '@/components/ui/empty-state';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { organisationEmails } from '@/lib/db/users';
import { env } from '@/lib/env';
import { readLocalMailbox } from '@/lib/mail/local-mailbox';

export const metadata: Metadata = { title: 'Mailbox' };

// Local mode only: what the fake SMTP server caught, limited to mail for this admin's
// own people and the people they invited.
export default async function MailboxPage() {
  const admin = await requireRole('dealer_admin', 'brand_admin');
  if (!env().LOADPROOF_LOCAL) notFound();
  const mails = await readLocalMailbox();
  const ours = await organisationEmails(admin.organisationId);
  const shown = (mails ?? []).filter((m) => m.to.some((t) => ours.has(t.toLowerCase())));
  return (
    <>
      <PageHeader title="Mailbox" lead="Running locally, Loadproof hands its e-mail to a mail catcher instead of a real mail server. Here is what it caught for your people." />
      {mails === null ? (
        <Notice tone="warning">The local mail catcher is not answering at {env().LOCAL_MAILBOX_URL}.</Notice>
      ) : shown.length === 0 ? (
        <EmptyState title="No mail yet">Invitations, claim updates and reminders for your people will show up here as they are sent.</EmptyState>
      ) : (
        <ul className="space-y-3">
          {shown.map((m) => (
            <li key={m.id} className="card p-4" data-testid="caught-mail">
              <div className="flex flex-wrap justify-between gap-2 text-sm text-ink-muted">
                <span>To {m.to.join(', ')}</span>
                <time dateTime={m.receivedAt}>{new Date(m.receivedAt).toLocaleString('en-GB', { timeZone: admin.timeZone })}</time>
              </div>
              <p className="mt-1 font-bold">{m.subject}</p>
              <pre className="mt-2 whitespace-pre-wrap font-sans text-sm text-ink-soft">{m.text}</pre>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
