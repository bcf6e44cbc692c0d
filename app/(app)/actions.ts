'use server';

import { revalidatePath } from 'next/cache';
import { requireUser } from '@/lib/auth/session';
import { setUserUnits } from '@/lib/db/users';
import { unitsSchema } from '@/lib/validation/preferences';

export async function setUnitsAction(units: string): Promise<void> {
  const user = await requireUser();
  await setUserUnits(user.id, unitsSchema.parse(units));
  revalidatePath('/', 'layout');
}
