// A claim whose approved parts the dealer fitted from its own shelf: the brand ships nothing, the
// replacement track goes straight to the after-test, and the core still comes back.
import { describe, expect, it } from 'vitest';
import { explainRefusal, type ClaimEvent } from '@/machines/claim';
import { approvedValue, Clock, drive, snapshotOf, steps } from './support';

function fromStock(s: ReturnType<typeof steps>): ClaimEvent {
  const approve = s.approveFull();
  return { ...approve, nothingToShip: true } as ClaimEvent;
}

describe('approved with nothing to ship', () => {
  it('lands on "from shop stock", not in the warehouse’s to-ship list', () => {
    const s = steps(new Clock());
    const stored = drive([[s.submit(), 'submitted'], [s.take(), 'in_review'], [fromStock(s), approvedValue('from_shop_stock', 'requested')]]);
    expect(stored.context.replacement.fromShopStock).toBe(true);
  });

  it('refuses a shipment and says why', () => {
    const s = steps(new Clock());
    const stored = drive([[s.submit(), 'submitted'], [s.take(), 'in_review'], [fromStock(s), approvedValue('from_shop_stock', 'requested')]]);
    const ship = s.ship();
    const snapshot = snapshotOf(stored);
    expect(snapshot.can(ship)).toBe(false);
    expect(explainRefusal(snapshot, ship)).toBe('There is nothing to ship: the dealer fitted every approved part from its own stock.');
  });

  it('a passing after-test verifies the repair; the core track runs as usual, then the credit', () => {
    const s = steps(new Clock());
    drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [fromStock(s), approvedValue('from_shop_stock', 'requested')],
      [s.fitted(true), approvedValue('verified', 'requested')],
      [s.coreShipped(), approvedValue('verified', 'in_transit')],
      [s.coreReceived(), approvedValue('verified', 'received')],
      [s.inspect('fault_confirmed'), 'credit_pending'],
      [s.credit(), 'credited'],
    ]);
  });

  it('a failing after-test waits for a new one or the rep’s acceptance by hand', () => {
    const s = steps(new Clock());
    drive([
      [s.submit(), 'submitted'],
      [s.take(), 'in_review'],
      [fromStock(s), approvedValue('from_shop_stock', 'requested')],
      [s.fitted(false), approvedValue('fitted', 'requested')],
      [s.acceptByHand(), approvedValue('verified', 'requested')],
    ]);
  });

  it('without the flag an approval waits for the warehouse as before', () => {
    const s = steps(new Clock());
    const stored = drive([[s.submit(), 'submitted'], [s.take(), 'in_review'], [s.approveFull(), approvedValue('to_ship', 'requested')]]);
    expect(snapshotOf(stored).can(s.fitted(true))).toBe(false);
  });
});
