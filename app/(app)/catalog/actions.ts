'use server';

import { revalidatePath } from 'next/cache';
import { requireRole } from '@/lib/auth/session';
import { addHoliday, addPrice, changeLaborRate, removeHoliday, saveLaborOperation, saveModel, savePart, savePolicy } from '@/lib/services/catalog';
import { validatedAction } from '@/lib/validation/action';
import { holidayDaySchema, holidaySchema, laborRateSchema, laborSchema, modelSchema, partSchema, policySchema, priceSchema } from '@/lib/validation/catalog';

// Each action checks the role itself: a server action is a public endpoint.
const admin = () => requireRole('brand_admin');
const done = (path: string, message: string) => {
  revalidatePath(path);
  revalidatePath('/catalog');
  return { ok: true, message };
};

export const saveModelAction = validatedAction(modelSchema, async (input) => done('/catalog/models', (await saveModel(await admin(), input)).message));
export const savePartAction = validatedAction(partSchema, async (input) => done('/catalog/parts', (await savePart(await admin(), input)).message));
export const savePolicyAction = validatedAction(policySchema, async (input) => done('/catalog/policies', (await savePolicy(await admin(), input)).message));
export const saveLaborAction = validatedAction(laborSchema, async (input) => done('/catalog/labor', (await saveLaborOperation(await admin(), input)).message));
export const addPriceAction = validatedAction(priceSchema, async (input) => done('/catalog/prices', (await addPrice(await admin(), input)).message));
export const addHolidayAction = validatedAction(holidaySchema, async (input) => done('/catalog/holidays', (await addHoliday(await admin(), input)).message));
export const removeHolidayAction = validatedAction(holidayDaySchema, async ({ day }) => done('/catalog/holidays', (await removeHoliday(await admin(), day)).message));
export const laborRateAction = validatedAction(laborRateSchema, async (input) => done('/catalog/dealers', (await changeLaborRate(await admin(), input)).message));
