import { SMALL_BATTERY_MAX_WH, watthourRating } from '@/lib/shipping';
import { formatPower, formatQuantity, formatTorque, fromSi, roundTo, toSi, unitLabel, type UnitSystem } from '@/lib/units';

/** Units an admin may type a spec in; stored in SI at the column's precision. */
export const POWER_INPUT_UNITS = ['w', 'hp'] as const;
export const TORQUE_INPUT_UNITS = ['nm', 'lbft'] as const;
export const MASS_INPUT_UNITS = ['kg', 'lb'] as const;
export type PowerInputUnit = (typeof POWER_INPUT_UNITS)[number];
export type TorqueInputUnit = (typeof TORQUE_INPUT_UNITS)[number];
export type MassInputUnit = (typeof MASS_INPUT_UNITS)[number];

/** Decimals the database keeps: numeric(8,1) W, numeric(8,2) N·m, numeric(7,2) kg. */
export const STORED_DECIMALS = { power: 1, torque: 2, mass: 2 } as const;

export const specToSi = {
  power: (v: number, unit: PowerInputUnit) => roundTo(toSi('power', v, unit), STORED_DECIMALS.power),
  torque: (v: number, unit: TorqueInputUnit) => roundTo(toSi('torque', v, unit), STORED_DECIMALS.torque),
  mass: (v: number, unit: MassInputUnit) => roundTo(toSi('mass', v, unit), STORED_DECIMALS.mass),
};

export const defaultInputUnits = (system: UnitSystem) =>
  system === 'imperial'
    ? { power: 'hp' as PowerInputUnit, torque: 'lbft' as TorqueInputUnit, mass: 'lb' as MassInputUnit }
    : { power: 'w' as PowerInputUnit, torque: 'nm' as TorqueInputUnit, mass: 'kg' as MassInputUnit };

/**
 * A stored SI value written in an input unit with enough digits that saving it again gives the
 * same stored value (300 W → "0.402308" hp → 300.0 W).
 */
export function specInputValue(quantity: 'power' | 'torque' | 'mass', valueSi: number | null, unit: string): string {
  if (valueSi === null) return '';
  const v = fromSi(quantity, valueSi, unit as never);
  const digits = unit === 'w' || unit === 'nm' || unit === 'kg' ? STORED_DECIMALS[quantity] : 6;
  return String(roundTo(v, digits));
}

export const inputUnitLabel = (quantity: 'power' | 'torque' | 'mass', unit: string) => unitLabel(quantity, unit as never);

export type BatteryEnergy = { wh: number; text: string; fullyRegulated: boolean };

/** Rated energy Wh = V × Ah (49 CFR 171.8); above 100 Wh a battery ships fully regulated (49 CFR 173.185(c)). */
export function batteryEnergy(nominalVoltageV: number | null, ratedCapacityAh: number | null): BatteryEnergy | null {
  if (!nominalVoltageV || !ratedCapacityAh) return null;
  const wh = watthourRating(nominalVoltageV, ratedCapacityAh);
  return { wh, text: `${roundTo(wh, 1).toFixed(1)} Wh`, fullyRegulated: wh > SMALL_BATTERY_MAX_WH };
}

type SpecPart = { minWheelPowerW: number | null; minWheelTorqueNm: number | null; ratedCapacityAh: number | null; nominalVoltageV: number | null };

/** The load-test spec in the reader's units, as short phrases. */
export function describeSpec(p: SpecPart, system: UnitSystem): string[] {
  const out: string[] = [];
  if (p.minWheelPowerW !== null) out.push(`≥ ${formatPower(p.minWheelPowerW, system).text} at the wheel`);
  if (p.minWheelTorqueNm !== null) out.push(`≥ ${formatTorque(p.minWheelTorqueNm, system).text} at the wheel`);
  const energy = batteryEnergy(p.nominalVoltageV, p.ratedCapacityAh);
  if (energy) out.push(`${p.nominalVoltageV} V × ${p.ratedCapacityAh} Ah = ${energy.text}`);
  return out;
}

export const describeWeight = (kg: number | null, system: UnitSystem) => (kg === null ? null : formatQuantity('mass', kg, system, 1).text);
