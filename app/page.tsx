import { redirect } from 'next/navigation';
import { HOME_PATH } from '@/lib/auth/roles';
import { requireUser } from '@/lib/auth/session';

export default async function Root() {
  const user = await requireUser();
  redirect(HOME_PATH[user.role]);
}
