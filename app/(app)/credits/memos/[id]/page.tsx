import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { z } from 'zod';
import { MemoDocument } from '@/components/credits/memo-document';
import { PrintButton } from '@/components/credits/print-button';
import { requireRole } from '@/lib/auth/session';
import { findMemoForUser } from '@/lib/db/credit-memos';

export const metadata: Metadata = { title: 'Credit memo' };

/** The shop's copy of a memo, ready to print. */
export default async function DealerMemoPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireRole('dealer_admin');
  const { id } = await params;
  if (!z.uuid().safeParse(id).success) notFound();
  const memo = await findMemoForUser(user, id);
  if (!memo) notFound();
  return (
    <div className="space-y-4">
      <div className="flex items-center justify-between print:hidden">
        <p className="text-sm text-ink-muted"><Link href="/credits" className="underline">Credits</Link></p>
        <PrintButton label="Print or save as PDF" />
      </div>
      <MemoDocument memo={memo} claimHref={`/claims/${memo.claimId}`} memoHref={(mid) => `/credits/memos/${mid}`} />
    </div>
  );
}
