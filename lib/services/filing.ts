import 'server-only';
import { localDate } from '@/lib/calendar';
import { assessCoverage, CoverageInputError, type CoverageAssessment, type ExclusionCode, type PartCategory } from '@/lib/coverage';
import { currentPrices, findPolicy, findRegisteredUnit, listLaborOperations, listModels, listParts } from '@/lib/db/catalog';
import { openClaimsOnSerial, type ClaimRecord } from '@/lib/db/claims';
import { dealerAccounts, findDealerAccount } from '@/lib/db/dealer-accounts';
import type { AppUser } from '@/lib/db/users';
import { NotFoundError } from '@/lib/errors';

/** What the new-claim form needs: each brand the shop sells, with its catalog. */
export async function filingOptions(user: AppUser) {
  const accounts = await dealerAccounts(user.organisationId);
  const today = localDate(new Date().toISOString(), user.timeZone);
  return Promise.all(
    accounts.map(async (a) => {
      const [models, parts, labor, prices] = await Promise.all([
        listModels(a.brandId), listParts(a.brandId), listLaborOperations(a.brandId), currentPrices(a.brandId, today),
      ]);
      const price = new Map(prices.map((p) => [p.partId, p.netPriceMinor]));
      return {
        brandId: a.brandId,
        brandName: a.brandName,
        accountNumber: a.accountNumber,
        currency: a.currency,
        models: models.filter((m) => m.active).map((m) => ({ id: m.id, name: m.name, code: m.code, legalClass: m.legalClass, tyreSize: m.tyreSize })),
        parts: parts.filter((p) => p.active).map((p) => ({ id: p.id, partNumber: p.partNumber, name: p.name, category: p.category, netPriceMinor: price.get(p.id) ?? null })),
        labor: labor.filter((l) => l.active).map((l) => ({ id: l.id, code: l.code, description: l.description, category: l.category, hours: l.standardHours })),
      };
    }),
  );
}
export type FilingOptions = Awaited<ReturnType<typeof filingOptions>>;

export async function lookupFrameSerial(user: AppUser, brandId: string, serial: string) {
  if (!(await findDealerAccount(user.organisationId, brandId))) throw new NotFoundError('Your shop has no account with that brand.');
  const unit = await findRegisteredUnit(brandId, serial);
  const open = await openClaimsOnSerial(brandId, { frameSerial: unit?.frameSerial ?? serial }, { dealerId: user.organisationId });
  return {
    registered: !!unit,
    unit: unit && { frameSerial: unit.frameSerial, modelId: unit.modelId, modelName: unit.modelName, retailSaleDate: unit.retailSaleDate, componentSerials: unit.componentSerials },
    openClaims: open.map((o) => (o.dealerId === user.organisationId ? { id: o.id, number: o.number, stage: o.stage, ours: true } : { id: null, number: null, stage: o.stage, ours: false })),
  };
}

export type CoverageView = { status: 'assessed'; assessment: CoverageAssessment } | { status: 'incomplete'; message: string };

/** Coverage for a claim as it stands, from the brand's policy for the part's category. */
export async function coverageForClaim(
  claim: Pick<ClaimRecord, 'brandId' | 'partCategory' | 'saleDate' | 'failureDate' | 'registeredUnitId' | 'batteryCycles'>,
  opts: { proofOfPurchase: boolean; measuredCapacityPct?: number; flaggedExclusions?: ExclusionCode[] },
): Promise<CoverageView> {
  if (!claim.partCategory) return { status: 'incomplete', message: 'Choose the failed part to see its coverage.' };
  if (!claim.failureDate) return { status: 'incomplete', message: 'Enter the failure date to see coverage.' };
  const policy = await findPolicy(claim.brandId, claim.partCategory as PartCategory);
  if (!policy) return { status: 'incomplete', message: 'This brand has no warranty policy for this kind of part; the rep decides by hand.' };
  try {
    const assessment = assessCoverage({
      policy: {
        category: policy.category,
        coverageMonths: policy.coverageMonths,
        cycleLimit: policy.cycleLimit ?? undefined,
        capacityThresholdPct: policy.capacityThresholdPct ?? undefined,
        exclusions: policy.exclusions as ExclusionCode[],
      },
      saleDate: claim.saleDate,
      failureDate: claim.failureDate,
      proofOfPurchase: opts.proofOfPurchase,
      registered: claim.registeredUnitId !== null,
      batteryCycles: claim.partCategory === 'battery' ? (claim.batteryCycles ?? undefined) : undefined,
      measuredCapacityPct: opts.measuredCapacityPct,
      flaggedExclusions: opts.flaggedExclusions,
    });
    return { status: 'assessed', assessment };
  } catch (err) {
    if (err instanceof CoverageInputError) return { status: 'incomplete', message: err.message };
    throw err;
  }
}
