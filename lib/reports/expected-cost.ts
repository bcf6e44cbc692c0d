import { decimalToShortString, decimalToString, fromBigInt, isMinorUnits, parseExactDecimal, roundQuotient, type ExactDecimal, type MinorUnits } from '@/lib/money';
import { ReportInputError } from './report-input-error';

export interface WarrantyOutcome {
  label: string;
  /** "0.06" or "6%". All outcomes together must come to exactly 1. */
  probability: string;
  /** The cost if this outcome happens (0 for "no repair"). */
  costMinor: MinorUnits;
}

export interface ExpectedCost {
  /** Σ probability × cost, rounded once (house rule) to a minor unit. */
  expectedMinor: MinorUnits;
  /** The same sum, exact, in minor units ("4600000000" or "1666.5"). */
  exactMinor: string;
  outcomes: { label: string; probability: string; costMinor: MinorUnits; weightedExactMinor: string }[];
}

/**
 * The expected value of a warranty obligation across its possible outcomes, each weighted by its
 * probability (IAS 37 ¶39: a large population of items is measured at the probability-weighted
 * expected value). The probabilities must cover every outcome, "no repair" included, and sum to
 * exactly 1; the sum of the weighted costs is kept exact and rounded once.
 */
export function expectedCost(outcomes: readonly WarrantyOutcome[]): ExpectedCost {
  if (outcomes.length === 0) throw new ReportInputError('outcomes: list at least one outcome');
  const parsed = outcomes.map((o, i) => {
    const where = `outcomes[${i}] (${o.label})`;
    const p = parseProbability(o.probability);
    if (!p) throw new ReportInputError(`${where}.probability: ${JSON.stringify(o.probability)} is not a probability like "0.06" or "6%"`);
    if (p.units < 0n || compareToOne(p) > 0) throw new ReportInputError(`${where}.probability: ${o.probability} is not between 0 and 1`);
    if (!isMinorUnits(o.costMinor)) throw new ReportInputError(`${where}.costMinor: must be a whole number of minor units`);
    return { ...o, p };
  });
  const scale = Math.max(...parsed.map((o) => o.p.scale));
  const at = (d: ExactDecimal) => d.units * 10n ** BigInt(scale - d.scale);
  const totalProbability = parsed.reduce((a, o) => a + at(o.p), 0n);
  if (totalProbability !== 10n ** BigInt(scale)) {
    const sum = decimalToString({ units: totalProbability, scale });
    throw new ReportInputError(`outcomes: the probabilities sum to ${sum}, not 1; list every outcome, "no repair" included`);
  }
  const weighted = parsed.map((o) => BigInt(o.costMinor) * at(o.p));
  const sum = weighted.reduce((a, w) => a + w, 0n);
  const denominator = 10n ** BigInt(scale);
  const trim = (units: bigint) => decimalToShortString({ units, scale });
  return {
    expectedMinor: fromBigInt(roundQuotient(sum, denominator), 'expected cost'),
    exactMinor: trim(sum),
    outcomes: parsed.map((o, i) => ({
      label: o.label,
      probability: o.probability,
      costMinor: o.costMinor,
      weightedExactMinor: trim(weighted[i] as bigint),
    })),
  };
}

function parseProbability(text: string): ExactDecimal | undefined {
  const t = text.trim();
  const percent = t.endsWith('%');
  const p = parseExactDecimal(percent ? t.slice(0, -1).trim() : t);
  if (!p.ok) return undefined;
  return percent ? { units: p.value.units, scale: p.value.scale + 2 } : p.value;
}

function compareToOne(d: ExactDecimal): number {
  const one = 10n ** BigInt(d.scale);
  return d.units < one ? -1 : d.units > one ? 1 : 0;
}
