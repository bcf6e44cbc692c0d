import { escapeHtml, layout } from '@/lib/mail/templates/layout';

export function claimUpdateMail(p: { name: string; title: string; body: string; claimNumber: string; link: string }) {
  const subject = `[${p.claimNumber}] ${p.title}`;
  const text = [`Hello ${p.name},`, '', p.body, '', `Open the claim: ${p.link}`, '', 'You get this because you work on this claim in Loadproof.'].join('\n');
  const html = layout(
    `<p>Hello ${escapeHtml(p.name)},</p>
     <p style="font-weight:bold">${escapeHtml(p.title)}</p>
     <p>${escapeHtml(p.body)}</p>
     <p><a href="${escapeHtml(p.link)}">Open claim ${escapeHtml(p.claimNumber)}</a></p>
     <p style="color:#626c71;font-size:12px">You get this because you work on this claim in Loadproof.</p>`,
  );
  return { subject, text, html };
}
