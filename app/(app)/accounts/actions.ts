'use server';

import { revalidatePath } from 'next/cache';
import { requireRole } from '@/lib/auth/session';
import { ValidationError } from '@/lib/errors';
import { formatMoney, parseAmount, type CurrencyCode } from '@/lib/money';
import { addLiabilityEntry } from '@/lib/services/accounting-reports';
import { editCreditLine, issueChargebackMemo, reverseMemo } from '@/lib/services/credits';
import { validatedAction } from '@/lib/validation/action';
import { chargebackSchema, editLineSchema, liabilityEntrySchema, reverseMemoSchema } from '@/lib/validation/credits';
import { brandSettings } from '@/lib/db/liability';

export const editLineAction = validatedAction(editLineSchema, async ({ claimId, lineNo, amount, reason }) => {
  const user = await requireRole('accountant');
  await editCreditLine(user, claimId, { lineNo, amount, reason });
  revalidatePath(`/accounts/claims/${claimId}`);
  return { ok: true, message: `Line ${lineNo} changed. Check the total, then issue.` };
});

export const reverseMemoAction = validatedAction(reverseMemoSchema, async ({ memoId, reason }) => {
  const user = await requireRole('accountant');
  const out = await reverseMemo(user, memoId, reason);
  revalidatePath('/accounts', 'layout');
  return { ok: true, message: out.replayed ? `Already reversed by ${out.number}.` : `Reversing memo ${out.number} issued.` };
});

export const chargebackAction = validatedAction(chargebackSchema, async ({ claimId, reason, note }) => {
  const user = await requireRole('accountant');
  const out = await issueChargebackMemo(user, claimId, { reason, note });
  revalidatePath(`/accounts/claims/${claimId}`);
  return { ok: true, message: out.replayed ? `Chargeback memo ${out.number} was issued already.` : `Chargeback memo ${out.number} issued.` };
});

export const liabilityEntryAction = validatedAction(liabilityEntrySchema, async ({ entryDate, kind, amount, note, clientKey }) => {
  const user = await requireRole('accountant');
  const { currency } = await brandSettings(user.organisationId);
  const parsed = parseAmount(amount, { currency: currency as CurrencyCode });
  if (!parsed.ok) throw new ValidationError('The amount is not an amount.', { amount: [parsed.message] });
  const out = await addLiabilityEntry(user, { entryDate, kind, amountMinor: parsed.value, note, ...(clientKey ? { clientKey } : {}) });
  revalidatePath('/accounts/reports');
  const what = `Entry of ${formatMoney(parsed.value, currency as CurrencyCode, { accounting: true })} on ${entryDate}`;
  return { ok: true, message: out.replayed ? `${what} was recorded already; nothing added.` : `${what} recorded.` };
});
