import { z } from 'zod';
import { DEALER_ROLES } from '@/lib/auth/roles';
import { apiRoute } from '@/lib/http/api';
import { lookupFrameSerial } from '@/lib/services/filing';

const query = z.object({ brand: z.uuid('Choose a brand.'), serial: z.string().trim().min(3, 'Enter at least 3 characters.').max(40) });

export const GET = apiRoute(DEALER_ROLES, async ({ user, req }) => {
  const q = query.parse(Object.fromEntries(new URL(req.url).searchParams));
  return lookupFrameSerial(user, q.brand, q.serial);
});
