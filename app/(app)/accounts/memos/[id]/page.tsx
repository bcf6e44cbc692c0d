import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { z } from 'zod';
import { MemoDocument } from '@/components/credits/memo-document';
import { PrintButton } from '@/components/credits/print-button';
import { ReverseMemoForm } from '@/components/credits/reverse-memo-form';
import { requireRole } from '@/lib/auth/session';
import { findMemoForUser } from '@/lib/db/credit-memos';

export const metadata: Metadata = { title: 'Credit memo' };

export default async function AccountMemoPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireRole('accountant');
  const { id } = await params;
  if (!z.uuid().safeParse(id).success) notFound();
  const memo = await findMemoForUser(user, id);
  if (!memo) notFound();
  return (
    <div className="space-y-4">
      <div className="flex items-center justify-between print:hidden">
        <p className="text-sm text-ink-muted">
          <Link href="/accounts/memos" className="underline">Credit memos</Link> · <Link href={`/accounts/claims/${memo.claimId}`} className="underline">the claim’s credit</Link>
        </p>
        <PrintButton />
      </div>
      <MemoDocument memo={memo} claimHref={`/claims/${memo.claimId}`} memoHref={(mid) => `/accounts/memos/${mid}`} />
      {memo.kind !== 'reversal' && !memo.reversedByMemoId ? <ReverseMemoForm memoId={memo.id} number={memo.number} /> : null}
    </div>
  );
}
