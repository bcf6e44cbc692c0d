import type { BatteryAnalysis, DynoAnalysis, ImportSource, LegalClassId, TestConditions } from '@/lib/loadtest';
import type { UnitSystem } from '@/lib/units';

/** Which side of the repair a run proves. */
export type LoadTestPhase = 'before' | 'after';
/** A roller-dynamometer run (drive parts) or a capacity discharge (batteries). */
export type LoadTestKind = 'dyno' | 'battery';
/** Where the column mapping came from: our own column names, the dealer's saved mapping, or entered for this file. */
export type MappingSource = 'recognised' | 'saved' | 'entered';

/** Test conditions as stored: SI (Pa, kg, °C, mm for a measured roll-out, % for state of charge). */
export type LoadTestConditionsSi = TestConditions;

/** The yardstick a run was checked against, frozen with the run so a later catalog edit cannot change a past verdict. */
export type LoadTestSpec =
  | {
      readonly kind: 'dyno';
      readonly minWheelPowerW: number | null;
      readonly minWheelTorqueNm: number | null;
      readonly legalClass: LegalClassId | null;
      readonly partNumber: string | null;
    }
  | {
      readonly kind: 'battery';
      readonly ratedCapacityAh: number;
      readonly nominalVoltageV: number | null;
      readonly thresholdPct: number | null;
      readonly partNumber: string | null;
    };

export interface CircumferenceUsed {
  readonly metres: number;
  readonly source: 'measured' | 'iso-estimate';
  readonly tyreIso: string | null;
  readonly notes: readonly string[];
}

/**
 * A dyno run's figures in both unit systems, never the raw samples. Peaks, band and checks are the
 * library's over the whole file; `bins` (the curve, per 1 km/h or per 1 mph) leave out the run-down
 * (the roller slowing with no drive), so it does not pull the curve's means down.
 */
export interface DynoSummary {
  readonly kind: 'dyno';
  readonly metric: DynoAnalysis;
  readonly imperial: DynoAnalysis;
  /** How many run-down samples the curve leaves out. */
  readonly curve: { readonly samplesLeftOut: number };
  readonly fileUnits: UnitSystem;
  readonly circumference: CircumferenceUsed;
  readonly source: ImportSource;
}

export interface BatterySummary {
  readonly kind: 'battery';
  readonly analysis: BatteryAnalysis;
  readonly signFlipped: boolean;
  readonly source: ImportSource;
}

export type LoadTestSummary = DynoSummary | BatterySummary;

/** Bike model legal classes as the catalog stores them → the analysis library's ids. */
const LEGAL_CLASS_IDS: Readonly<Record<string, LegalClassId>> = {
  eu_pedelec: 'eu-pedelec',
  us_class1: 'us-class-1',
  us_class2: 'us-class-2',
  us_class3: 'us-class-3',
};

export function legalClassId(catalogValue: string | null | undefined): LegalClassId | null {
  return catalogValue ? (LEGAL_CLASS_IDS[catalogValue] ?? null) : null;
}

/** Batteries are proved by a capacity discharge; every other part on the dyno. */
export function loadTestKindFor(partCategory: string | null): LoadTestKind {
  return partCategory === 'battery' ? 'battery' : 'dyno';
}
