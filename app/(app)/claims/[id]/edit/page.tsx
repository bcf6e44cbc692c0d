import type { Metadata } from 'next';
import { notFound, redirect } from 'next/navigation';
import { z } from 'zod';
import { ClaimForm } from '@/components/claims/claim-form';
import { PageHeader } from '@/components/ui/page-header';
import { requireRole } from '@/lib/auth/session';
import { findClaimForUser } from '@/lib/db/claims';
import { filingOptions } from '@/lib/services/filing';
import { toDecimalString, type CurrencyCode } from '@/lib/money';

export const metadata: Metadata = { title: 'Edit claim' };

export default async function EditClaimPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireRole('dealer', 'dealer_admin');
  const { id } = await params;
  if (!z.uuid().safeParse(id).success) notFound();
  const claim = await findClaimForUser(user, id);
  if (!claim) notFound();
  if (claim.stage !== 'draft') redirect(`/claims/${claim.id}`);
  const options = await filingOptions(user);
  return (
    <>
      <PageHeader title={`Edit ${claim.number}`} lead="Details can change until the claim goes to the brand." />
      <ClaimForm
        options={options}
        units={user.units}
        claimId={claim.id}
        version={claim.version}
        initial={{
          brandId: claim.brandId, frameSerial: claim.frameSerial, modelId: claim.modelId ?? '', saleDate: claim.saleDate ?? '',
          partId: claim.partId ?? '', partSerial: claim.partSerial, failureDate: claim.failureDate ?? '', odometerKm: claim.odometerKm,
          batteryCycles: claim.batteryCycles === null ? '' : String(claim.batteryCycles), symptom: claim.symptom, errorCodes: claim.errorCodes,
          description: claim.description, customerName: claim.customerName, customerEmail: claim.customerEmail, customerPhone: claim.customerPhone,
          parts: claim.requestedLines.parts.map((p) => ({ partId: p.partId, quantity: p.quantity, fromDealerStock: p.fromDealerStock })),
          labor: claim.requestedLines.labor.map((l) => l.operationId),
          freight: claim.requestedLines.freightMinor ? toDecimalString(claim.requestedLines.freightMinor, claim.currency as CurrencyCode) : '',
        }}
      />
    </>
  );
}
