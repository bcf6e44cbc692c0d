'use server';

import { revalidatePath } from 'next/cache';
import { requireRole } from '@/lib/auth/session';
import { inviteUser, setDisabled } from '@/lib/services/people';
import { validatedAction } from '@/lib/validation/action';
import { inviteSchema, userIdSchema } from '@/lib/validation/people';
import { z } from 'zod';

export const inviteAction = validatedAction(inviteSchema, async (input) => {
  const admin = await requireRole('dealer_admin', 'brand_admin');
  await inviteUser(admin, input);
  revalidatePath('/people');
  return { ok: true, message: `Invitation sent to ${input.email}.` };
});

export const setDisabledAction = validatedAction(
  userIdSchema.extend({ disabled: z.enum(['true', 'false']) }),
  async ({ userId, disabled }) => {
    const admin = await requireRole('dealer_admin', 'brand_admin');
    await setDisabled(admin, userId, disabled === 'true');
    revalidatePath('/people');
    return { ok: true, message: disabled === 'true' ? 'Account switched off.' : 'Account switched on.' };
  },
);
