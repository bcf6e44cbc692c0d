import 'server-only';
import { env } from '@/lib/env';
import { drainOutbox } from '@/lib/jobs/outbox';
import { pollTracking, runCoreClock } from '@/lib/services/tracking';
import { remindReviewDeadlines } from '@/lib/jobs/review-deadlines';
import { removeAbandonedUploads } from '@/lib/jobs/upload-cleanup';

export type Job = { name: string; everyMs: number; run: () => Promise<unknown> };

// Background work the worker process runs on a clock. Add a job here to have it run.
export const jobs: Job[] = [
  { name: 'outbox', everyMs: 2_000, run: drainOutbox },
  { name: 'carrier-tracking', everyMs: env().CARRIER_POLL_SECONDS * 1000, run: () => pollTracking() },
  { name: 'core-return-clock', everyMs: 10 * 60_000, run: () => runCoreClock() },
  // Review deadlines near or passed: once per claim, threshold and deadline.
  { name: 'review-deadlines', everyMs: 5 * 60_000, run: () => remindReviewDeadlines() },
  { name: 'abandoned-uploads', everyMs: 10 * 60_000, run: () => removeAbandonedUploads() },
];
