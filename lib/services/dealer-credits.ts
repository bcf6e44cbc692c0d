import 'server-only';
import { dealerAccounts } from '@/lib/db/dealer-accounts';
import { memosWithLines } from '@/lib/db/credit-memos';
import type { AppUser } from '@/lib/db/users';
import { ForbiddenError, NotFoundError } from '@/lib/errors';
import { sumMinor, type CurrencyCode } from '@/lib/money';
import { exportMemosCsv } from '@/lib/reports';
import { forExport, openMemos } from '@/lib/services/accounting-reports';

function requireShopAdmin(user: AppUser): void {
  if (user.role !== 'dealer_admin') throw new ForbiddenError('Only the shop admin sees the shop’s credits.');
}

/** The shop's memos and open chargebacks, brand by brand. */
export async function dealerCredits(user: AppUser) {
  requireShopAdmin(user);
  const [accounts, memos] = await Promise.all([dealerAccounts(user.organisationId), memosWithLines({ dealerId: user.organisationId })]);
  return accounts.map((a) => {
    const mine = memos.filter((m) => m.brandId === a.brandId).reverse();
    const open = openMemos(mine);
    const openChargebacks = open
      .filter((m) => m.kind !== 'reversal' && m.reversedByMemoId === null)
      .flatMap((m) => m.lines.filter((l) => l.kind === 'chargeback' && l.amountMinor !== 0).map((l) => ({ memo: m, line: l })));
    return {
      brandId: a.brandId,
      brandName: a.brandName,
      accountNumber: a.accountNumber,
      currency: a.currency as CurrencyCode,
      memos: mine,
      openTotalMinor: sumMinor(open.map((m) => m.totalMinor)),
      openChargebacks,
    };
  });
}

/** One brand's memos for the shop's books, in our documented CSV layout. */
export async function dealerExport(user: AppUser, brandId: string): Promise<{ csv: string; brandName: string }> {
  requireShopAdmin(user);
  const account = (await dealerAccounts(user.organisationId)).find((a) => a.brandId === brandId);
  if (!account) throw new NotFoundError('Your shop has no account with that brand.');
  const memos = await memosWithLines({ dealerId: user.organisationId, brandId });
  return { csv: exportMemosCsv(memos.map(forExport)), brandName: account.brandName };
}
