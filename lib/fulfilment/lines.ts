// Which approved lines travel in the replacement parcel, and whether the warehouse has picked them.

export interface PartLine {
  lineId: string;
  partId: string;
  partNumber: string;
  name: string;
  quantity: number;
  /** The dealer fitted a part from its own shelf and is credited for it: nothing to send. */
  fromDealerStock: boolean;
}

export interface LineVerdict {
  lineId: string;
  approved: boolean;
}

/**
 * The part lines the brand agreed to: the approved lines when the decision wrote them, else the
 * requested lines the decision marked approved.
 */
export function approvedPartLines(approved: { parts: PartLine[] } | null, requested: { parts: PartLine[] }, verdicts: LineVerdict[]): PartLine[] {
  if (approved) return approved.parts.filter((p) => p.quantity > 0);
  const ok = new Set(verdicts.filter((v) => v.approved).map((v) => v.lineId));
  return requested.parts.filter((p) => p.quantity > 0 && ok.has(p.lineId));
}

export function linesToShip(lines: PartLine[]): PartLine[] {
  return lines.filter((l) => !l.fromDealerStock);
}

export function linesFromDealerStock(lines: PartLine[]): PartLine[] {
  return lines.filter((l) => l.fromDealerStock);
}

/** Every line to ship must be ticked as picked, and nothing else; null when the pick is complete. */
export function pickProblem(toShip: PartLine[], pickedLineIds: readonly string[]): string | null {
  if (!toShip.length) return 'This claim has no parts to send: every approved part came from the dealer’s own stock.';
  const known = new Set(toShip.map((l) => l.lineId));
  const stray = pickedLineIds.filter((id) => !known.has(id));
  if (stray.length) return `Line ${stray.join(', ')} is not one of this claim’s lines to ship.`;
  const picked = new Set(pickedLineIds);
  const missing = toShip.filter((l) => !picked.has(l.lineId));
  if (missing.length) {
    return `Tick every line as picked before shipping; not picked yet: ${missing.map((l) => `${l.quantity} × ${l.partNumber}`).join(', ')}.`;
  }
  return null;
}

/** Total quantity per part (a claim may list one part on two lines). */
export function quantitiesByPart(lines: PartLine[]): Map<string, { partNumber: string; quantity: number }> {
  const out = new Map<string, { partNumber: string; quantity: number }>();
  for (const l of lines) {
    const prev = out.get(l.partId);
    out.set(l.partId, { partNumber: l.partNumber, quantity: (prev?.quantity ?? 0) + l.quantity });
  }
  return out;
}

/**
 * Why nothing ships for an approved claim, in the dealer's words and the brand's: every approved
 * part came from the shop's shelf, or no part was approved at all (labor or freight only).
 */
export function nothingShipsText(approvedParts: readonly Pick<PartLine, 'quantity' | 'fromDealerStock'>[], audience: 'dealer' | 'brand'): string {
  const fromStock = approvedParts.some((p) => p.quantity > 0 && p.fromDealerStock);
  if (audience === 'dealer') return fromStock ? 'Nothing ships: you fitted the approved parts from your own stock.' : 'Nothing ships: no replacement part was approved.';
  return fromStock ? 'Nothing to ship: the dealer fitted every approved part from its own stock.' : 'Nothing to ship: no replacement part was approved.';
}
