import type { PartCategory } from '@/lib/coverage';

export const LEGAL_CLASS_IDS = ['eu_pedelec', 'us_class1', 'us_class2', 'us_class3'] as const;
export type LegalClassCode = (typeof LEGAL_CLASS_IDS)[number];

/** What each class means for the dyno check (limits: Reg. (EU) 168/2013 Art. 2(2)(h); 36 CFR 1.4). */
export const LEGAL_CLASS_LABELS: Record<LegalClassCode, string> = {
  eu_pedelec: 'EU pedelec — assist cut off at 25 km/h',
  us_class1: 'US class 1 — pedal assist to 20 mph',
  us_class2: 'US class 2 — throttle, to 20 mph',
  us_class3: 'US class 3 — pedal assist to 28 mph',
};

export const CATEGORY_NAMES: Record<PartCategory, string> = {
  drive_unit: 'Drive unit / motor',
  battery: 'Battery',
  controller: 'Controller',
  display: 'Display',
  charger: 'Charger',
  frame: 'Frame',
  other: 'Other',
};

/** Parts whose load test is a dyno run; a drive unit must have a minimum to be judged against. */
export const DYNO_CATEGORIES: readonly PartCategory[] = ['drive_unit', 'controller'];
