import { BAR_PA, FT_M, HP_W, INCH_M, LB_KG, LBF_FT_NM, MILE_M, MPH_MS, PSI_PA } from './constants';

/**
 * One unit of a quantity. A value in this unit is `value * factor` in SI, or `value / divisor`
 * when the unit is an exact submultiple (dividing by 1000 or 3.6 rounds once, multiplying by
 * 0.001 or 0.2777… would round twice).
 */
export interface UnitDefinition {
  readonly label: string;
  readonly factor?: number;
  readonly divisor?: number;
}

export const UNITS = {
  power: {
    w: { label: 'W', factor: 1 },
    kw: { label: 'kW', factor: 1000 },
    hp: { label: 'hp', factor: HP_W },
  },
  torque: {
    nm: { label: 'N·m', factor: 1 },
    lbft: { label: 'lbf·ft', factor: LBF_FT_NM },
  },
  speed: {
    ms: { label: 'm/s', factor: 1 },
    kmh: { label: 'km/h', divisor: 3.6 },
    mph: { label: 'mph', factor: MPH_MS },
  },
  time: {
    s: { label: 's', factor: 1 },
    ms: { label: 'ms', divisor: 1000 },
    min: { label: 'min', factor: 60 },
    h: { label: 'h', factor: 3600 },
  },
  length: {
    m: { label: 'm', factor: 1 },
    mm: { label: 'mm', divisor: 1000 },
    in: { label: 'in', factor: INCH_M },
    ft: { label: 'ft', factor: FT_M },
    mi: { label: 'mi', factor: MILE_M },
  },
  pressure: {
    pa: { label: 'Pa', factor: 1 },
    kpa: { label: 'kPa', factor: 1000 },
    bar: { label: 'bar', factor: BAR_PA },
    psi: { label: 'psi', factor: PSI_PA },
  },
  mass: {
    kg: { label: 'kg', factor: 1 },
    lb: { label: 'lb', factor: LB_KG },
  },
  voltage: {
    v: { label: 'V', factor: 1 },
    mv: { label: 'mV', divisor: 1000 },
  },
  current: {
    a: { label: 'A', factor: 1 },
    ma: { label: 'mA', divisor: 1000 },
  },
} as const satisfies Record<string, Record<string, UnitDefinition>>;

/** A physical quantity with a linear unit scale. Temperature is affine: see `temperature.ts`. */
export type Quantity = keyof typeof UNITS;
export type UnitOf<Q extends Quantity> = keyof (typeof UNITS)[Q] & string;

export type PowerUnit = UnitOf<'power'>;
export type TorqueUnit = UnitOf<'torque'>;
export type SpeedUnit = UnitOf<'speed'>;
export type TimeUnit = UnitOf<'time'>;
export type LengthUnit = UnitOf<'length'>;
export type PressureUnit = UnitOf<'pressure'>;
export type MassUnit = UnitOf<'mass'>;
export type VoltageUnit = UnitOf<'voltage'>;
export type CurrentUnit = UnitOf<'current'>;

/** The SI unit each quantity is stored in. */
export const SI_UNIT = {
  power: 'w',
  torque: 'nm',
  speed: 'ms',
  time: 's',
  length: 'm',
  pressure: 'pa',
  mass: 'kg',
  voltage: 'v',
  current: 'a',
} as const satisfies { [Q in Quantity]: UnitOf<Q> };

export function unitDefinition<Q extends Quantity>(quantity: Q, unit: UnitOf<Q>): UnitDefinition {
  const table = UNITS[quantity] as Record<string, UnitDefinition>;
  const def = table[unit];
  if (!def) throw new RangeError(`Unknown ${quantity} unit "${unit}"; known: ${Object.keys(table).join(', ')}`);
  return def;
}

export function isUnitOf<Q extends Quantity>(quantity: Q, unit: string): unit is UnitOf<Q> {
  return Object.prototype.hasOwnProperty.call(UNITS[quantity], unit);
}

export function unitLabel<Q extends Quantity>(quantity: Q, unit: UnitOf<Q>): string {
  return unitDefinition(quantity, unit).label;
}

/** Value in `unit` → SI. */
export function toSi<Q extends Quantity>(quantity: Q, value: number, unit: UnitOf<Q>): number {
  const def = unitDefinition(quantity, unit);
  return def.divisor !== undefined ? value / def.divisor : value * (def.factor ?? 1);
}

/** SI value → `unit`. */
export function fromSi<Q extends Quantity>(quantity: Q, valueSi: number, unit: UnitOf<Q>): number {
  const def = unitDefinition(quantity, unit);
  return def.divisor !== undefined ? valueSi * def.divisor : valueSi / (def.factor ?? 1);
}

export function convert<Q extends Quantity>(quantity: Q, value: number, from: UnitOf<Q>, to: UnitOf<Q>): number {
  if (from === to) return value;
  return fromSi(quantity, toSi(quantity, value, from), to);
}

/** A scale usable in hot loops: SI = raw * mul / div (one of the two is 1). */
export function siScale<Q extends Quantity>(quantity: Q, unit: UnitOf<Q>): { mul: number; div: number } {
  const def = unitDefinition(quantity, unit);
  return def.divisor !== undefined ? { mul: 1, div: def.divisor } : { mul: def.factor ?? 1, div: 1 };
}
