import { createHash } from 'node:crypto';
import type { CreditMemoDraft } from './types';

/**
 * A fingerprint of a draft memo: what the accountant saw when pressing Issue. The issue request
 * carries it, so a retried or double-clicked issue of the same draft finds the memo already
 * issued (idempotency key = claim + fingerprint), and a draft that changed meanwhile is refused.
 * Node-only (node:crypto); not exported from the browser-safe index.
 */
export function draftHash(draft: CreditMemoDraft): string {
  return createHash('sha256').update(JSON.stringify(draft)).digest('hex');
}
