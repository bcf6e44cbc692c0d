'use server';

import { redirect } from 'next/navigation';
import { acceptInvitation } from '@/lib/services/people';
import { validatedAction } from '@/lib/validation/action';
import { acceptInviteSchema } from '@/lib/validation/people';

export const acceptInviteAction = validatedAction(acceptInviteSchema, async ({ token, password }) => {
  const { email } = await acceptInvitation(token, password);
  redirect(`/signin?welcome=1&email=${encodeURIComponent(email)}`);
});
