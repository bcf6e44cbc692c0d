/**
 * THE rounding rule for money in Loadproof, stated once and used everywhere:
 *
 *   round half up, meaning half AWAY FROM ZERO, to a whole minor unit (the cent).
 *
 *   1.5 → 2, 2.5 → 3, −1.5 → −2, −2.5 → −3, 2.4999 → 2.
 *
 * Why away from zero: it is symmetric, so a chargeback or reversal computed from a negated quantity
 * is exactly the negation of the credit it undoes (round(−x) = −round(x)); half-up toward +∞ would
 * leave a one-cent residue on every reversed half cent. This is the rule decimal.js calls
 * ROUND_HALF_UP and ECMA-402 calls "halfExpand".
 *
 * Every computation that can produce a fraction of a minor unit keeps the exact value as a
 * rational (bigint numerator / bigint denominator) and calls `roundQuotient` exactly once.
 */
export const ROUNDING_RULE = 'half away from zero, to a whole minor unit' as const;

export function roundQuotient(numerator: bigint, denominator: bigint): bigint {
  if (denominator <= 0n) throw new RangeError('roundQuotient: the denominator must be positive');
  const negative = numerator < 0n;
  const magnitude = negative ? -numerator : numerator;
  const quotient = magnitude / denominator;
  const remainder = magnitude % denominator;
  const rounded = remainder * 2n >= denominator ? quotient + 1n : quotient;
  return negative ? -rounded : rounded;
}
