import 'server-only';
import { deleteIntent, expiredIntents } from '@/lib/db/attachments';
import { deleteObject } from '@/lib/storage/s3';

/**
 * Upload tickets never completed (a closed tab, a refused file the browser never reported):
 * their objects may hold a photo with its location data or a receipt, so they do not stay.
 */
export async function removeAbandonedUploads(): Promise<number> {
  let removed = 0;
  for (;;) {
    const batch = await expiredIntents(100);
    if (!batch.length) return removed;
    for (const i of batch) {
      await deleteObject(i.storageKey).catch(() => {});
      await deleteIntent(i.id);
      removed++;
    }
  }
}
