import 'server-only';
import { coveragePolicySchema } from '@/lib/coverage';
import {
  brandSettings, deleteHoliday, findPart, insertHoliday, insertLaborOperation, insertModel, insertPart, insertPrice,
  updateLaborOperation, updateModel, updatePart, upsertPolicy, type BrandSettings,
} from '@/lib/db/catalog';
import { setLaborRate } from '@/lib/db/dealer-accounts';
import type { AppUser } from '@/lib/db/users';
import { ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import { formatMoney, parseAmount, type CurrencyCode, type MinorUnits } from '@/lib/money';
import type { HolidayInput, LaborInput, LaborRateInput, ModelInput, PartInput, PolicyInput, PriceInput } from '@/lib/validation/catalog';

/** Only a brand admin keeps a catalog, and only the brand's own. */
async function adminBrand(user: AppUser): Promise<BrandSettings> {
  if (user.role !== 'brand_admin' || user.orgKind !== 'brand') throw new ForbiddenError('Only the brand admin keeps the catalog.');
  const brand = await brandSettings(user.organisationId);
  if (!brand) throw new NotFoundError('No such brand.');
  return brand;
}

type PgError = { code?: string; constraint?: string };

/** A unique or check constraint the database refused, as a message on the field it concerns. */
async function refusingDuplicates<T>(fn: () => Promise<T>, duplicates: Record<string, [field: string, message: string]>): Promise<T> {
  try {
    return await fn();
  } catch (err) {
    const e = err as PgError;
    if (e.code === '23505' && e.constraint && duplicates[e.constraint]) {
      const [field, message] = duplicates[e.constraint]!;
      throw new ValidationError(message, { [field]: [message] });
    }
    if (e.code === '23514') throw new ValidationError('These values break a rule of the catalog; nothing was saved.', { _form: ['Check the values and try again.'] });
    throw err;
  }
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** An amount typed by the admin, exact in the brand's currency (lib/money; a dot for decimals). */
function amountOf(text: string, brand: BrandSettings, field: string, opts: { allowZero?: boolean } = {}): MinorUnits {
  const parsed = parseAmount(text, { currency: brand.currency as CurrencyCode });
  if (!parsed.ok) throw new ValidationError(`${capital(parsed.message)}.`, { [field]: [`${capital(parsed.message)}; write it like 54.90 in ${brand.currency}.`] });
  if (parsed.value < 0 || (parsed.value === 0 && !opts.allowZero)) throw new ValidationError('The amount must be above zero.', { [field]: ['Must be above zero.'] });
  return parsed.value;
}

export async function saveModel(user: AppUser, input: ModelInput): Promise<{ id: string; message: string }> {
  const brand = await adminBrand(user);
  const row = { code: input.code, name: input.name, modelYear: input.modelYear ?? null, legalClass: input.legalClass, tyreSize: input.tyreSize, active: input.active };
  return refusingDuplicates(
    async () => {
      if (input.id) {
        if (!(await updateModel(brand.id, input.id, row))) throw new NotFoundError('No such model in your catalog.');
        return { id: input.id, message: `${input.name} saved.` };
      }
      return { id: await insertModel(brand.id, row), message: `${input.name} added.` };
    },
    { bike_models_brand_id_code_unique: ['code', `Another model already has the code ${input.code}.`] },
  );
}

export async function savePart(user: AppUser, input: PartInput): Promise<{ id: string; message: string }> {
  const brand = await adminBrand(user);
  const row = {
    partNumber: input.partNumber, name: input.name, category: input.category, minWheelPowerW: input.minWheelPowerW,
    minWheelTorqueNm: input.minWheelTorqueNm, ratedCapacityAh: input.ratedCapacityAh, nominalVoltageV: input.nominalVoltageV,
    weightKg: input.weightKg, unitCostMinor: input.unitCost ? amountOf(input.unitCost, brand, 'unitCost') : null, active: input.active,
  };
  return refusingDuplicates(
    async () => {
      if (input.id) {
        if (!(await updatePart(brand.id, input.id, row))) throw new NotFoundError('No such part in your catalog.');
        return { id: input.id, message: `${input.partNumber} saved.` };
      }
      return { id: await insertPart(brand.id, row), message: `${input.partNumber} added.` };
    },
    { parts_brand_id_part_number_unique: ['partNumber', `Another part already has the number ${input.partNumber}.`] },
  );
}

export async function savePolicy(user: AppUser, input: PolicyInput): Promise<{ message: string }> {
  const brand = await adminBrand(user);
  // The coverage check reads these terms; refuse any it could not use.
  const usable = coveragePolicySchema.safeParse({
    category: input.category, coverageMonths: input.coverageMonths, cycleLimit: input.cycleLimit,
    capacityThresholdPct: input.capacityThresholdPct, exclusions: input.exclusions,
  });
  if (!usable.success) {
    const issue = usable.error.issues[0]!;
    throw new ValidationError('The coverage check cannot use these terms.', { [String(issue.path[0] ?? '_form')]: [capital(issue.message)] });
  }
  await upsertPolicy(brand.id, {
    category: input.category, coverageMonths: input.coverageMonths, cycleLimit: input.cycleLimit ?? null,
    capacityThresholdPct: input.capacityThresholdPct ?? null, coreReturnDays: input.coreReturnDays, coreGraceDays: input.coreGraceDays,
    reviewDays: input.reviewDays, appealDays: input.appealDays, exclusions: input.exclusions,
  });
  return { message: 'Warranty terms saved. New coverage checks use them at once.' };
}

export async function saveLaborOperation(user: AppUser, input: LaborInput): Promise<{ id: string; message: string }> {
  const brand = await adminBrand(user);
  const row = { code: input.code, description: input.description, category: input.category, standardHours: input.standardHours, active: input.active };
  return refusingDuplicates(
    async () => {
      if (input.id) {
        if (!(await updateLaborOperation(brand.id, input.id, row))) throw new NotFoundError('No such operation in your schedule.');
        return { id: input.id, message: `${input.code} saved.` };
      }
      return { id: await insertLaborOperation(brand.id, row), message: `${input.code} added.` };
    },
    { labor_operations_brand_id_code_unique: ['code', `Another operation already has the code ${input.code}.`] },
  );
}

export async function addPrice(user: AppUser, input: PriceInput): Promise<{ message: string }> {
  const brand = await adminBrand(user);
  const part = await findPart(brand.id, input.partId);
  if (!part) throw new ValidationError('Unknown part.', { partId: ['Choose a part of your catalog.'] });
  const netPriceMinor = amountOf(input.netPrice, brand, 'netPrice');
  await refusingDuplicates(() => insertPrice(brand.id, { partId: part.id, netPriceMinor, effectiveFrom: input.effectiveFrom }), {
    price_list_part_id_effective_from_unique: ['effectiveFrom', `${part.partNumber} already has a price from ${input.effectiveFrom}; choose another date.`],
  });
  return { message: `${part.partNumber}: ${formatMoney(netPriceMinor, brand.currency as CurrencyCode)} from ${input.effectiveFrom}.` };
}

export async function addHoliday(user: AppUser, input: HolidayInput): Promise<{ message: string }> {
  const brand = await adminBrand(user);
  await refusingDuplicates(() => insertHoliday(brand.id, input), { brand_holidays_pkey: ['day', `${input.day} is already in the calendar.`] });
  return { message: `${input.day} (${input.name}) added; review and core-return deadlines skip it.` };
}

export async function removeHoliday(user: AppUser, day: string): Promise<{ message: string }> {
  const brand = await adminBrand(user);
  if (!(await deleteHoliday(brand.id, day))) throw new NotFoundError('That day is not in your calendar.');
  return { message: `${day} removed from the calendar.` };
}

export async function changeLaborRate(user: AppUser, input: LaborRateInput): Promise<{ message: string }> {
  const brand = await adminBrand(user);
  const rate = amountOf(input.laborRate, brand, 'laborRate');
  if (!(await setLaborRate(brand.id, input.accountId, rate))) throw new NotFoundError('No such dealer account.');
  const money = (m: number) => formatMoney(m, brand.currency as CurrencyCode);
  const capped = rate > brand.maxLaborRateMinor ? ` Credits pay at most ${money(brand.maxLaborRateMinor)} an hour, your cap.` : '';
  return { message: `Labor rate set to ${money(rate)} an hour for new credits.${capped}` };
}
