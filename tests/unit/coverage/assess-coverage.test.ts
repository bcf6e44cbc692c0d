import { describe, expect, it } from 'vitest';
import { assessCoverage, CoverageInputError, coveragePolicySchema, type CoverageInput, type CoveragePolicy } from '@/lib/coverage';

// Demo policies are invented. The rules checked here are our own, stated in lib/coverage/README.md.
const battery: CoveragePolicy = {
  category: 'battery',
  coverageMonths: 24,
  cycleLimit: 500,
  capacityThresholdPct: 70,
  exclusions: ['water_ingress', 'crash_damage', 'improper_charging'],
};
const claim: CoverageInput = {
  policy: battery,
  saleDate: '2025-03-14',
  failureDate: '2026-11-02',
  proofOfPurchase: false,
  registered: true,
  batteryCycles: 312,
  measuredCapacityPct: 64,
};
const reason = (a: ReturnType<typeof assessCoverage>, code: string) => a.reasons.find((r) => r.code === code);

describe('sale date and proof of purchase', () => {
  it('no sale date and no proof of purchase → unknown, needs proof of purchase', () => {
    const a = assessCoverage({ ...claim, saleDate: null, registered: false });
    expect(a.covered).toBe('unknown');
    expect(a.coverageEnds).toBeNull();
    expect(a.monthsElapsed).toBeNull();
    expect(reason(a, 'sale_date_evidence')).toMatchObject({ ok: false, outcome: 'open', text: 'No sale date and no proof of purchase: needs proof of purchase.' });
    expect(a.summary).toBe('Coverage not yet known. No sale date and no proof of purchase: needs proof of purchase.');
  });

  it('a proof of purchase without a date asks for the date', () => {
    const a = assessCoverage({ ...claim, saleDate: null, registered: false, proofOfPurchase: true });
    expect(a.covered).toBe('unknown');
    expect(reason(a, 'sale_date_evidence')?.text).toMatch(/enter the sale date shown on it/);
  });

  it('a typed-in sale date with neither registration nor proof is not enough', () => {
    const a = assessCoverage({ ...claim, registered: false, proofOfPurchase: false });
    expect(a.covered).toBe('unknown');
    expect(reason(a, 'sale_date_evidence')?.text).toBe('Sale date 2025-03-14 was entered but is not backed by a registration or a proof of purchase: needs proof of purchase.');
    expect(reason(a, 'coverage_period')?.ok).toBe(true);
  });

  it('an out-of-period failure is not covered even while the sale date is unproven', () => {
    expect(assessCoverage({ ...claim, registered: false, failureDate: '2027-06-01' }).covered).toBe(false);
  });

  it('a sale date after the failure date is refused with both dates named', () => {
    expect(() => assessCoverage({ ...claim, saleDate: '2026-12-01' })).toThrow(CoverageInputError);
    expect(() => assessCoverage({ ...claim, saleDate: '2026-12-01' })).toThrow(
      'failureDate: 2026-11-02 is before the sale date 2026-12-01; a part cannot fail before the bike was sold, so check both dates',
    );
  });
});

describe('battery cycles and capacity', () => {
  it('within months and cycles, capacity below the threshold is the covered fault', () => {
    const a = assessCoverage(claim);
    expect(a.covered).toBe(true);
    expect(a.summary).toBe('In coverage.');
    expect(reason(a, 'battery_cycles')?.text).toBe("The battery reports 312 charge cycles, within the policy's limit of 500.");
    expect(reason(a, 'battery_capacity')?.text).toBe(
      "Measured capacity 64 % of rated, below the policy's 70 % threshold: this capacity loss is the fault being claimed, and it is covered while the battery is within its months and cycles.",
    );
  });

  it('the cycle limit itself is covered; one more cycle is not', () => {
    expect(assessCoverage({ ...claim, batteryCycles: 500 }).covered).toBe(true);
    const over = assessCoverage({ ...claim, batteryCycles: 501 });
    expect(over.covered).toBe(false);
    expect(reason(over, 'battery_cycles')).toMatchObject({ ok: false, text: "The battery reports 501 charge cycles, over the policy's limit of 500: wear from that much use is not covered." });
  });

  it('capacity at or above the threshold is normal ageing, not a capacity fault', () => {
    const at = assessCoverage({ ...claim, measuredCapacityPct: 70 });
    expect(at.covered).toBe(false);
    expect(reason(at, 'battery_capacity')?.text).toMatch(/^Measured capacity 70 % of rated, at or above the policy's 70 % threshold: that is normal ageing/);
    expect(assessCoverage({ ...claim, measuredCapacityPct: 69.99 }).covered).toBe(true);
  });

  it('a battery claimed for another fault is not denied for good capacity', () => {
    const a = assessCoverage({ ...claim, measuredCapacityPct: 91, batteryFault: 'other' });
    expect(a.covered).toBe(true);
    expect(reason(a, 'battery_capacity')?.text).toMatch(/the claimed fault is not capacity loss, so capacity does not decide this claim/);
  });

  it('missing cycle count or capacity test leaves coverage open and says what to do', () => {
    const noCycles = assessCoverage({ ...claim, batteryCycles: undefined });
    expect(noCycles.covered).toBe('unknown');
    expect(reason(noCycles, 'battery_cycles')?.text).toMatch(/read the cycle count from the battery/);
    const noTest = assessCoverage({ ...claim, measuredCapacityPct: undefined, batteryFault: 'capacity_loss' });
    expect(noTest.covered).toBe('unknown');
    expect(reason(noTest, 'battery_capacity')?.text).toMatch(/a capacity test is needed/);
  });

  it('too many cycles fails even with a low capacity', () => {
    expect(assessCoverage({ ...claim, batteryCycles: 900, measuredCapacityPct: 40 }).covered).toBe(false);
  });
});

describe('exclusions', () => {
  it('a flagged exclusion in the policy denies coverage', () => {
    const a = assessCoverage({ ...claim, flaggedExclusions: ['water_ingress'] });
    expect(a.covered).toBe(false);
    expect(reason(a, 'exclusion.water_ingress')?.text).toBe('Excluded: water ingress (e.g. pressure washing or submersion). The policy does not cover a failure caused by it.');
  });

  it('a flag the policy does not exclude does not decide', () => {
    const a = assessCoverage({ ...claim, flaggedExclusions: ['commercial_use'] });
    expect(a.covered).toBe(true);
    expect(reason(a, 'exclusion.commercial_use')?.ok).toBe(true);
  });

  it('lists the policy exclusions when none is flagged', () => {
    expect(reason(assessCoverage(claim), 'exclusions')?.text).toMatch(/^No exclusion flagged\. The policy excludes: water ingress/);
  });
});

describe('input checks name the field', () => {
  it('refuses unknown codes and bad numbers', () => {
    expect(() => assessCoverage({ ...claim, flaggedExclusions: ['rust' as never] })).toThrow(/flaggedExclusions\[0\]: "rust" is not a known exclusion code/);
    expect(() => assessCoverage({ ...claim, policy: { ...battery, coverageMonths: 1.5 } })).toThrow(/policy\.coverageMonths: expected a whole number of months/);
    expect(() => assessCoverage({ ...claim, policy: { ...battery, category: 'wheel' as never } })).toThrow(/policy\.category: "wheel" is not a part category/);
    expect(() => assessCoverage({ ...claim, batteryCycles: -3 })).toThrow(/batteryCycles: cannot be negative/);
    expect(() => assessCoverage({ ...claim, failureDate: '2026-02-30' })).toThrow(/failureDate: '2026-02-30': day 30 does not exist in 2026-02/);
    expect(() => assessCoverage({ ...claim, policy: { category: 'display', coverageMonths: 24, exclusions: [] } })).toThrow(/batteryCycles: applies to a battery only/);
  });

  it('validates a policy on its own', () => {
    const bad = coveragePolicySchema.safeParse({ category: 'display', coverageMonths: 24, cycleLimit: 300, exclusions: [] });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0]?.path).toEqual(['cycleLimit']);
    expect(coveragePolicySchema.safeParse(battery).success).toBe(true);
  });
});
