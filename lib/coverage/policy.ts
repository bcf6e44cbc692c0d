/** Part categories a brand's warranty policy is written for. */
export const PART_CATEGORIES = ['drive_unit', 'battery', 'controller', 'display', 'charger', 'frame', 'other'] as const;
export type PartCategory = (typeof PART_CATEGORIES)[number];

export const PART_CATEGORY_LABELS: Record<PartCategory, string> = {
  drive_unit: 'drive unit (motor)',
  battery: 'battery',
  controller: 'controller',
  display: 'display',
  charger: 'charger',
  frame: 'frame',
  other: 'other part',
};

/** Our own exclusion codes, with the words a rep and a dealer read. */
export const EXCLUSION_LABELS = {
  wear_item: 'wear item (brake pads, tyres, chain, cassette and the like)',
  crash_damage: 'crash or impact damage',
  water_ingress: 'water ingress (e.g. pressure washing or submersion)',
  modification: 'modification or tampering (e.g. a changed speed limiter or unapproved parts)',
  commercial_use: 'commercial use (rental or delivery fleets)',
  improper_charging: 'charging with a charger not approved for the battery',
  unapproved_repair: 'opened or repaired outside an approved workshop',
} as const;
export type ExclusionCode = keyof typeof EXCLUSION_LABELS;
export const EXCLUSION_CODES = Object.keys(EXCLUSION_LABELS) as ExclusionCode[];

/** A brand's warranty terms for one part category. */
export interface CoveragePolicy {
  category: PartCategory;
  /** Months from the retail sale date (see COVERAGE_PERIOD_RULE_TEXT). */
  coverageMonths: number;
  /** Battery only: charge cycles covered; the limit itself is still covered. */
  cycleLimit?: number;
  /** Battery only: a measured capacity below this % of rated is a covered fault. */
  capacityThresholdPct?: number;
  exclusions: readonly ExclusionCode[];
}
