import { randomBytes } from 'node:crypto';
import { db } from '@/db/connection';
import { driveToCreditPending, insertDraftClaim, type CoreEnd, type Path } from '@/db/seeds/drive-claim';
import type { ClaimLines } from '@/lib/credits/from-claim';
import { findActiveUser, type AppUser } from '@/lib/db/users';
import { actAs, userId } from './acting-user';

// Claims driven through the real machine to the money end of the lifecycle, with unique frame
// serials, so each test owns its claims in the shared test database.

export const PEOPLE = {
  torvane: { rep: 'priya.nair@torvane.test', warehouse: 'felix.moreau@torvane.test', accountant: 'hana.sato@torvane.test' },
  wrenfield: { rep: 'ines.costa@wrenfield.test', warehouse: 'tom.reyes@wrenfield.test', accountant: 'ada.kowalski@wrenfield.test' },
  dealers: {
    kettenblatt: { dealer: 'lena.hartmann@kettenblatt.test', admin: 'jonas.weber@kettenblatt.test' },
    lanternhill: { dealer: 'sam.okafor@lanternhill.test', admin: 'rita.vance@lanternhill.test' },
    tidewheel: { dealer: 'theo.marsh@tidewheel.test', admin: 'maya.lindqvist@tidewheel.test' },
  },
} as const;

export async function signedIn(email: string): Promise<AppUser> {
  const id = await actAs(email);
  const user = await findActiveUser(id!);
  if (!user) throw new Error(`no active user ${email}`);
  return user;
}

const orgId = async (slug: string) => (await db()('organisations').where({ slug }).first('id')).id as string;

export type TestClaimSpec = {
  brand?: 'torvane' | 'wrenfield';
  dealer?: keyof typeof PEOPLE.dealers;
  partNumber?: string;
  parts?: { partNumber: string; quantity: number; fromDealerStock: boolean }[];
  labor?: string[];
  freightMinor?: number;
  afterTest?: Path['afterTest'];
  core?: CoreEnd;
  approved?: (r: ClaimLines) => ClaimLines;
  stopAfter?: Path['stopAfter'];
};

/** A claim in credit_pending (or stopped earlier), with a frame serial no other test uses. */
export async function claimFor(spec: TestClaimSpec = {}): Promise<{ id: string; number: string; rmaNumber: string }> {
  const brand = spec.brand ?? 'torvane';
  const dealer = spec.dealer ?? 'kettenblatt';
  const brandId = await orgId(brand);
  const dealerId = await orgId(dealer);
  const partNumber = spec.partNumber ?? (brand === 'torvane' ? 'TV-DU85' : 'WF-HM750');
  const dealerUser = await userId(PEOPLE.dealers[dealer].dealer);
  const at = new Date(Date.now() - 40 * 86_400_000).toISOString();
  const claim = await insertDraftClaim(db(), {
    dealerId, brandId, frameSerial: `T-${randomBytes(5).toString('hex').toUpperCase()}`, partNumber, partSerial: `PS-${randomBytes(3).toString('hex')}`,
    failureDate: at.slice(0, 10), symptom: 'Test claim: assist cuts out', description: 'Integration test claim.', customerName: 'Test Rider',
    parts: spec.parts ?? [{ partNumber, quantity: 1, fromDealerStock: false }],
    labor: spec.labor ?? (brand === 'torvane' ? ['DU-RR', 'LT-BA'] : ['HM-WHL']),
    freightMinor: spec.freightMinor ?? 1850,
    openedBy: dealerUser, openedAt: at,
  });
  const { rmaNumber } = await driveToCreditPending(db(), claim.id, {
    dealer: dealerUser, rep: await userId(PEOPLE[brand].rep), warehouse: await userId(PEOPLE[brand].warehouse),
    submittedAt: new Date(Date.parse(at) + 3_600_000).toISOString(),
    afterTest: spec.afterTest ?? 'passed', core: spec.core ?? 'fault_confirmed',
    ...(spec.approved ? { approved: spec.approved } : {}),
    ...(spec.stopAfter ? { stopAfter: spec.stopAfter } : {}),
  });
  return { ...claim, rmaNumber };
}

/** A freight amount no other memo is likely to have, so amount matching finds exactly one memo. */
export function oddFreight(): number {
  return 100_00 + Math.floor(Math.random() * 900_00);
}

export async function stageOf(claimId: string): Promise<string> {
  return (await db()('claims').where({ id: claimId }).first('stage')).stage;
}

export async function memoCount(claimId: string): Promise<number> {
  return Number((await db()('credit_memos').where({ claim_id: claimId }).count('id as n').first())!.n);
}
