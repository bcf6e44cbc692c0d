import { quantitiesByPart, type PartLine } from './lines';

export interface StockLevel {
  onHand: number;
  restockExpectedOn: string | null;
}

export interface LineAvailability {
  lineId: string;
  partId: string;
  partNumber: string;
  quantity: number;
  onHand: number;
  /** Enough on the shelf for this claim's whole need of the part. */
  inStock: boolean;
  /** When more is expected, for a back-ordered line. */
  expectedOn: string | null;
}

/** For each line to ship: in stock, or back-ordered with the date the warehouse expects more. */
export function lineAvailability(toShip: PartLine[], stock: ReadonlyMap<string, StockLevel>): LineAvailability[] {
  const need = quantitiesByPart(toShip);
  return toShip.map((l) => {
    const level = stock.get(l.partId);
    const onHand = level?.onHand ?? 0;
    const inStock = onHand >= (need.get(l.partId)?.quantity ?? l.quantity);
    return { lineId: l.lineId, partId: l.partId, partNumber: l.partNumber, quantity: l.quantity, onHand, inStock, expectedOn: inStock ? null : (level?.restockExpectedOn ?? null) };
  });
}

/** The refusal for shipping more than the shelf holds, or null. */
export function shortageProblem(availability: LineAvailability[]): string | null {
  const short = availability.filter((a) => !a.inStock);
  if (!short.length) return null;
  const parts = short.map((a) => `${a.partNumber} (${a.onHand} on hand, ${a.quantity} needed${a.expectedOn ? `, more expected ${a.expectedOn}` : ''})`);
  return `Not enough stock to ship: ${parts.join('; ')}. Nothing was shipped; the line stays back-ordered.`;
}

// ---- stock adjustments: our own reasons ----

export const ADJUSTMENT_REASONS = ['delivery_received', 'count_correction', 'damaged_in_store', 'returned_to_supplier', 'other'] as const;
export type AdjustmentReason = (typeof ADJUSTMENT_REASONS)[number];

export const ADJUSTMENT_REASON_LABELS: Record<AdjustmentReason, string> = {
  delivery_received: 'Delivery from the factory received',
  count_correction: 'Correction after a stock count',
  damaged_in_store: 'Damaged in the warehouse',
  returned_to_supplier: 'Sent back to the supplier',
  other: 'Other (say why in the note)',
};

/** The sign a reason allows, and whether it needs a note; null when the adjustment makes sense. */
export function adjustmentProblem(reason: AdjustmentReason, delta: number, note: string): string | null {
  if (!Number.isSafeInteger(delta) || delta === 0) return 'Enter how many to add (like 5) or remove (like -2); zero changes nothing.';
  if (reason === 'delivery_received' && delta < 0) return 'A delivery adds stock; use a positive number.';
  if ((reason === 'damaged_in_store' || reason === 'returned_to_supplier') && delta > 0) return `${ADJUSTMENT_REASON_LABELS[reason]} removes stock; use a negative number.`;
  if (reason === 'other' && !note.trim()) return 'Say in the note why the stock changes.';
  return null;
}
