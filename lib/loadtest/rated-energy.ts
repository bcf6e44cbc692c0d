/**
 * Watt-hour rating of a lithium battery = rated capacity (Ah) × nominal voltage (V), as defined in
 * 49 CFR 171.8. It decides how a battery ships (e.g. above 100 Wh: fully regulated Class 9).
 */
export function ratedEnergyWh(nominalVoltageV: number, ratedCapacityAh: number): number {
  if (!Number.isFinite(nominalVoltageV) || nominalVoltageV <= 0) throw new RangeError(`Nominal voltage must be a positive number of volts, got ${nominalVoltageV}`);
  if (!Number.isFinite(ratedCapacityAh) || ratedCapacityAh <= 0) throw new RangeError(`Rated capacity must be a positive number of ampere-hours, got ${ratedCapacityAh}`);
  return nominalVoltageV * ratedCapacityAh;
}
