import { z } from 'zod';
import { ROLES } from '@/lib/auth/roles';

export const inviteSchema = z.object({
  name: z.string().trim().min(2, 'Enter the person’s name.').max(120),
  email: z.email('Enter a valid e-mail address.').trim().toLowerCase(),
  role: z.enum(ROLES, { message: 'Choose a role.' }),
});
export type InviteInput = z.infer<typeof inviteSchema>;

export const PASSWORD_MIN = 10;

export const acceptInviteSchema = z
  .object({
    token: z.string().min(20, 'This invitation link is not complete.'),
    password: z.string().min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`).max(200),
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ.' });

export const userIdSchema = z.object({ userId: z.uuid('Unknown user.') });
