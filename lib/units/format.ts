import { fromSi, unitLabel, type Quantity, type UnitOf } from './convert';
import { roundTo } from './rounding';
import { celsiusToFahrenheit } from './temperature';

export type UnitSystem = 'metric' | 'imperial';

export interface FormattedQuantity {
  /** Rounded value in the display unit. */
  readonly value: number;
  /** Unit label, e.g. "km/h". */
  readonly unit: string;
  /** Value and unit ready to show, e.g. "25.0 km/h". */
  readonly text: string;
}

interface DisplayRule<Q extends Quantity> {
  readonly unit: UnitOf<Q>;
  readonly decimals: number;
}

/**
 * Display unit and rounding per quantity and unit system. Decimals follow what the reading is
 * good for: a wheel dyno resolves about a watt and a tenth of a newton metre; a tyre gauge a
 * tenth of a bar or one psi.
 */
export const DISPLAY_RULES = {
  metric: {
    power: { unit: 'w', decimals: 0 },
    torque: { unit: 'nm', decimals: 1 },
    speed: { unit: 'kmh', decimals: 1 },
    length: { unit: 'mm', decimals: 0 },
    pressure: { unit: 'bar', decimals: 1 },
    mass: { unit: 'kg', decimals: 0 },
  },
  imperial: {
    power: { unit: 'hp', decimals: 2 },
    torque: { unit: 'lbft', decimals: 1 },
    speed: { unit: 'mph', decimals: 1 },
    length: { unit: 'in', decimals: 1 },
    pressure: { unit: 'psi', decimals: 0 },
    mass: { unit: 'lb', decimals: 0 },
  },
} as const satisfies Record<UnitSystem, { [Q in DisplayQuantity]: DisplayRule<Q> }>;

export type DisplayQuantity = 'power' | 'torque' | 'speed' | 'length' | 'pressure' | 'mass';

/** The display unit id a user of `system` sees for `quantity`. */
export function displayUnit<Q extends DisplayQuantity>(quantity: Q, system: UnitSystem): UnitOf<Q> {
  return DISPLAY_RULES[system][quantity].unit as UnitOf<Q>;
}

function make(value: number, decimals: number, unit: string): FormattedQuantity {
  const rounded = roundTo(value, decimals);
  return { value: rounded, unit, text: `${rounded.toFixed(decimals)} ${unit}` };
}

/** Format an SI value for display in the user's unit system. `decimals` overrides the default. */
export function formatQuantity(
  quantity: DisplayQuantity,
  valueSi: number,
  system: UnitSystem,
  decimals?: number,
): FormattedQuantity {
  const rule = DISPLAY_RULES[system][quantity] as DisplayRule<typeof quantity>;
  const unit = rule.unit as UnitOf<typeof quantity>;
  return make(fromSi(quantity, valueSi, unit), decimals ?? rule.decimals, unitLabel(quantity, unit));
}

export const formatPower = (watts: number, system: UnitSystem) => formatQuantity('power', watts, system);
export const formatTorque = (nm: number, system: UnitSystem) => formatQuantity('torque', nm, system);
export const formatSpeed = (ms: number, system: UnitSystem) => formatQuantity('speed', ms, system);
export const formatLength = (m: number, system: UnitSystem) => formatQuantity('length', m, system);
export const formatPressure = (pa: number, system: UnitSystem) => formatQuantity('pressure', pa, system);
export const formatMass = (kg: number, system: UnitSystem) => formatQuantity('mass', kg, system);

/** Temperature is stored in °C; shown to 1 degree. */
export function formatTemperature(celsius: number, system: UnitSystem): FormattedQuantity {
  return system === 'metric' ? make(celsius, 0, '°C') : make(celsiusToFahrenheit(celsius), 0, '°F');
}
