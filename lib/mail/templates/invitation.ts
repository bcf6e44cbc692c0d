import { ROLE_LABELS, type Role } from '@/lib/auth/roles';
import { escapeHtml, layout } from '@/lib/mail/templates/layout';

export function invitationMail(p: { name: string; orgName: string; invitedBy: string; role: Role; link: string; days: number }) {
  const subject = `${p.invitedBy} added you to ${p.orgName} on Loadproof`;
  const text = [
    `Hello ${p.name},`,
    '',
    `${p.invitedBy} has set up a Loadproof account for you at ${p.orgName} (${ROLE_LABELS[p.role]}).`,
    `Choose your password here within ${p.days} days:`,
    p.link,
    '',
    'If you did not expect this, ignore this message; nothing happens until the link is used.',
  ].join('\n');
  const html = layout(
    `<p>Hello ${escapeHtml(p.name)},</p>
     <p>${escapeHtml(p.invitedBy)} has set up a Loadproof account for you at <b>${escapeHtml(p.orgName)}</b> (${escapeHtml(ROLE_LABELS[p.role])}).</p>
     <p><a href="${escapeHtml(p.link)}">Choose your password</a> within ${p.days} days.</p>
     <p style="color:#626c71">If you did not expect this, ignore this message; nothing happens until the link is used.</p>`,
  );
  return { subject, text, html };
}
