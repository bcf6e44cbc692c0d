import { ShippingInputError } from './input-error';

// Scope: lithium-ion batteries (e-bike packs). Lithium-metal cells (UN3090/UN3091) are out of scope.
// Every reference marked `fromMemory: true` (and the comments saying "from memory") was not
// confirmed against a published copy; the rest is in /work/shared/product/reference-values.md.

export type BatteryPacking = 'alone' | 'with_equipment' | 'in_equipment' | 'vehicle';
export type BatteryCondition = 'sound' | 'damaged_or_defective';
export type TransportMode = 'ground' | 'air';
export type TransportService = 'ground' | 'air_cargo_aircraft' | 'air_passenger_aircraft';
export type LithiumUnNumber = 'UN3480' | 'UN3481' | 'UN3171';

export const BATTERY_PACKINGS: readonly BatteryPacking[] = ['alone', 'with_equipment', 'in_equipment', 'vehicle'];
export const BATTERY_CONDITIONS: readonly BatteryCondition[] = ['sound', 'damaged_or_defective'];

export interface LithiumShipmentInput {
  nominalVoltageV: number;
  ratedCapacityAh: number;
  /** alone = a battery on its own; with_equipment = boxed beside the part it powers; in_equipment = fitted in it; vehicle = a whole e-bike. */
  packing: BatteryPacking;
  condition: BatteryCondition;
  /** The mode asked for; marks are chosen for it (default ground). */
  mode?: TransportMode;
  /** outbound = replacement to the dealer, return = the core back to the brand. */
  direction?: 'outbound' | 'return';
  /** Needed to confirm air carriage of a battery shipped alone (≤ 30 %). */
  stateOfChargePct?: number;
  /** Watt-hours of one cell, when known (20 Wh per cell is the small-cell limit). */
  cellWatthours?: number;
}

export interface RuleApplied {
  ref: string;
  text: string;
  fromMemory: boolean;
}

export interface MarkDetail {
  text: string;
  ref: string;
  fromMemory: boolean;
}

export interface LithiumClassification {
  unNumber: LithiumUnNumber;
  properShippingName: string;
  hazardClass: '9';
  /** Wh = V × Ah (49 CFR 171.8), float noise removed. */
  watthours: number;
  /** True when the small-battery provisions of 49 CFR 173.185(c) cannot be used. */
  fullyRegulatedClass9: boolean;
  smallBatteryProvisions: boolean;
  /** Some air service is possible (possibly cargo aircraft only, with conditions). */
  airAllowed: boolean;
  passengerAircraftAllowed: boolean;
  airReasons: string[];
  allowedServices: TransportService[];
  /** Null when no mode was asked for. */
  requestedModeAllowed: boolean | null;
  specialPackagingRequired: boolean;
  /** Packaging steps for a damaged or defective battery (from memory; see rules). */
  packagingSteps: string[];
  marks: string[];
  markDetails: MarkDetail[];
  cautions: string[];
  rules: RuleApplied[];
}

/** Watt-hour rating = nominal voltage × rated capacity (49 CFR 171.8); 36 V × 13.9 Ah = 500.4 Wh. */
export function watthourRating(nominalVoltageV: number, ratedCapacityAh: number): number {
  positive(nominalVoltageV, 'nominalVoltageV', 'V', 1000);
  positive(ratedCapacityAh, 'ratedCapacityAh', 'Ah', 1000);
  // Round away binary noise (36 × 13.9 = 500.40000000000003) so the 100 Wh test is on the real value.
  return Math.round(nominalVoltageV * ratedCapacityAh * 1e6) / 1e6;
}

/** Per battery; above it the battery is fully regulated Class 9 (49 CFR 173.185(c)). */
export const SMALL_BATTERY_MAX_WH = 100;
/** Per cell (49 CFR 173.185(c)). */
export const SMALL_CELL_MAX_WH = 20;
/** IATA PI 965: maximum state of charge for lithium ion batteries shipped alone by air. */
export const AIR_MAX_STATE_OF_CHARGE_PCT = 30;

const PROPER_SHIPPING_NAMES: Record<BatteryPacking, [LithiumUnNumber, string]> = {
  alone: ['UN3480', 'Lithium ion batteries'],
  with_equipment: ['UN3481', 'Lithium ion batteries packed with equipment'],
  in_equipment: ['UN3481', 'Lithium ion batteries contained in equipment'],
  vehicle: ['UN3171', 'Battery-powered vehicle'],
};

export function classifyLithiumShipment(input: LithiumShipmentInput): LithiumClassification {
  if (input === null || typeof input !== 'object') throw new ShippingInputError('input', 'expected a battery shipment');
  oneOf(input.packing, BATTERY_PACKINGS, 'packing');
  oneOf(input.condition, BATTERY_CONDITIONS, 'condition');
  if (input.mode !== undefined) oneOf(input.mode, ['ground', 'air'], 'mode');
  if (input.direction !== undefined) oneOf(input.direction, ['outbound', 'return'], 'direction');
  if (input.stateOfChargePct !== undefined) range(input.stateOfChargePct, 'stateOfChargePct', 0, 100, '%');
  if (input.cellWatthours !== undefined) positive(input.cellWatthours, 'cellWatthours', 'Wh', 1000);

  const wh = watthourRating(input.nominalVoltageV, input.ratedCapacityAh);
  if (input.cellWatthours !== undefined && input.cellWatthours > wh) {
    throw new ShippingInputError('cellWatthours', `${input.cellWatthours} Wh per cell is more than the whole battery (${wh} Wh)`);
  }
  const [unNumber, properShippingName] = PROPER_SHIPPING_NAMES[input.packing];
  const damaged = input.condition === 'damaged_or_defective';
  const vehicle = input.packing === 'vehicle';
  const alone = unNumber === 'UN3480';
  const mode = input.mode ?? 'ground';
  const rules: RuleApplied[] = [];
  const rule = (ref: string, text: string, fromMemory = false) => rules.push({ ref, text, fromMemory });

  rule('49 CFR 171.8', `Watt-hour rating = nominal voltage × rated capacity: ${input.nominalVoltageV} V × ${input.ratedCapacityAh} Ah = ${round1(wh)} Wh.`);
  rule('49 CFR 172.101', `${unNumber}, ${properShippingName}, Class 9: ${UN_MEANING[input.packing]}`);

  // --- size: small-battery provisions or fully regulated
  const cellTooBig = input.cellWatthours !== undefined && input.cellWatthours > SMALL_CELL_MAX_WH;
  const small = !vehicle && !damaged && wh <= SMALL_BATTERY_MAX_WH && !cellTooBig;
  if (vehicle) {
    // from memory: 49 CFR 173.220 governs battery-powered vehicles.
    rule('49 CFR 173.220', 'A whole e-bike ships as a battery-powered vehicle: its battery must be of a UN 38.3-tested type, protected against short circuit and unintended activation, and held in place.', true);
    rule('UN Model Regulations, recent editions', 'Recent editions list lithium-ion powered vehicles as UN3556 "Vehicle, lithium ion battery powered"; check which number the carrier and the rules in force use.', true);
  } else if (wh > SMALL_BATTERY_MAX_WH) {
    rule('49 CFR 173.185(c)', `${round1(wh)} Wh is above ${SMALL_BATTERY_MAX_WH} Wh per battery: the small-battery provisions do not apply; fully regulated Class 9.`);
  } else if (cellTooBig) {
    rule('49 CFR 173.185(c)', `A cell of ${input.cellWatthours} Wh is above ${SMALL_CELL_MAX_WH} Wh per cell: the small-battery provisions do not apply; fully regulated Class 9.`);
  } else {
    rule('49 CFR 173.185(c)', `${round1(wh)} Wh is at most ${SMALL_BATTERY_MAX_WH} Wh per battery${input.cellWatthours === undefined ? ` (cells assumed at most ${SMALL_CELL_MAX_WH} Wh each; enter the cell rating if unsure)` : ''}: the small-battery provisions may be used${damaged ? ', but not for a damaged or defective battery' : ''}.`);
  }

  // --- damaged or defective
  const packagingSteps: string[] = [];
  if (damaged) {
    rule('49 CFR 173.185(f); PHMSA interpretation 24-0050', 'Damaged or defective battery: must be packaged and shipped under 49 CFR 173.185(f).');
    rule('49 CFR 173.185(f)', 'The small-battery provisions do not apply to a damaged or defective battery, whatever its watt-hours.', true);
    // from memory: the packaging details of 173.185(f).
    packagingSteps.push(
      'Put each battery in its own non-metallic inner packaging that encloses it completely.',
      'Surround the inner packaging with non-combustible, non-conductive cushioning so the battery cannot move.',
      'Use a rigid outer packaging of the strength the rule requires.',
      'Mark the package "DAMAGED/DEFECTIVE LITHIUM ION BATTERIES".',
      'Ship by ground only.',
    );
    rule('49 CFR 173.185(f)', `Packaging: ${packagingSteps.join(' ')}`, true);
  }

  // --- air
  const airReasons: string[] = [];
  let cargoAir = true;
  let passengerAir = true;
  if (damaged) {
    cargoAir = passengerAir = false;
    airReasons.push('Damaged or defective lithium batteries are forbidden by air (IATA special provision A154; PHMSA guidance).');
    rule('IATA DGR special provision A154; PHMSA guidance', 'Damaged or defective lithium batteries are forbidden in air transport.');
  } else if (alone) {
    passengerAir = false;
    airReasons.push(`Lithium ion batteries shipped alone (UN3480) are forbidden on passenger aircraft: cargo aircraft only, at a state of charge of ${AIR_MAX_STATE_OF_CHARGE_PCT} % or less (IATA PI 965).`);
    rule('IATA PI 965', `UN3480 by air: cargo aircraft only (forbidden on passenger aircraft); state of charge ${AIR_MAX_STATE_OF_CHARGE_PCT} % or less.`);
    if (input.stateOfChargePct !== undefined && input.stateOfChargePct > AIR_MAX_STATE_OF_CHARGE_PCT) {
      cargoAir = false;
      airReasons.push(`State of charge ${input.stateOfChargePct} % is above ${AIR_MAX_STATE_OF_CHARGE_PCT} %: discharge the battery before an air shipment (IATA PI 965).`);
    } else if (input.stateOfChargePct === undefined) {
      airReasons.push(`Confirm the state of charge is ${AIR_MAX_STATE_OF_CHARGE_PCT} % or less before booking air.`);
    }
  } else if (vehicle) {
    // Our conservative choice: no passenger aircraft for a whole e-bike; IATA PI 952 from memory.
    passengerAir = false;
    airReasons.push('A whole e-bike by air goes cargo aircraft only in this app; conditions under IATA PI 952 (from memory) and many carriers refuse e-bikes: ask the carrier.');
    rule('IATA PI 952', 'Battery-powered vehicles by air: carrier approval and the instruction\'s conditions apply.', true);
  } else {
    const pi = input.packing === 'with_equipment' ? 'IATA PI 966' : 'IATA PI 967';
    airReasons.push(`${unNumber} (${properShippingName.toLowerCase()}) may go on passenger and cargo aircraft within the per-package limits of ${pi}.`);
    rule(pi, `${properShippingName} by air: passenger and cargo aircraft, within the instruction's per-package quantity limits; check the current edition for state-of-charge rules.`, true);
  }
  const allowedServices: TransportService[] = ['ground'];
  if (cargoAir) allowedServices.push('air_cargo_aircraft');
  if (passengerAir) allowedServices.push('air_passenger_aircraft');
  const airAllowed = cargoAir || passengerAir;
  const requestedModeAllowed = input.mode === undefined ? null : input.mode === 'ground' ? true : airAllowed;

  // --- always
  rule('49 CFR 173.185(a); UN Manual of Tests and Criteria, Part III, sub-section 38.3', 'The battery type must have passed the UN 38.3 tests, and its test summary must be available.', true);
  if (!small) {
    rule('49 CFR 172.704', 'Only staff trained for hazardous materials (for air, also IATA dangerous-goods training) may prepare a fully regulated shipment.', true);
    rule(
      mode === 'air' ? "IATA DGR, Shipper's Declaration for Dangerous Goods" : '49 CFR Part 172, Subparts C and G',
      mode === 'air' ? "A Shipper's Declaration for Dangerous Goods goes with the shipment." : 'Shipping papers with emergency response information go with the shipment.',
      true,
    );
  }

  const markDetails = marksFor({ unNumber, properShippingName, small, damaged, vehicle, airCargoOnly: mode === 'air' && alone });
  return {
    unNumber,
    properShippingName,
    hazardClass: '9',
    watthours: wh,
    fullyRegulatedClass9: !small,
    smallBatteryProvisions: small,
    airAllowed,
    passengerAircraftAllowed: passengerAir,
    airReasons,
    allowedServices,
    requestedModeAllowed,
    specialPackagingRequired: damaged,
    packagingSteps,
    marks: markDetails.map((m) => m.text),
    markDetails,
    cautions: cautionsFor(input, damaged, vehicle, mode === 'air' && alone),
    rules,
  };
}

/** The services a shipment may use (never air for a damaged or defective battery). */
export function allowedServices(input: LithiumShipmentInput): TransportService[] {
  return classifyLithiumShipment(input).allowedServices;
}

const UN_MEANING: Record<BatteryPacking, string> = {
  alone: 'a battery shipped on its own.',
  with_equipment: 'a battery packed in the same box as the equipment it powers.',
  in_equipment: 'a battery fitted in the equipment it powers.',
  vehicle: 'a whole e-bike with its battery.',
};

function marksFor(c: { unNumber: LithiumUnNumber; properShippingName: string; small: boolean; damaged: boolean; vehicle: boolean; airCargoOnly: boolean }): MarkDetail[] {
  const marks: MarkDetail[] = [];
  if (c.small) {
    // from memory: the paragraph of the lithium battery mark and its small-quantity exceptions.
    marks.push({ text: `Lithium battery mark with ${c.unNumber} and a telephone number`, ref: '49 CFR 173.185(c)(3)', fromMemory: true });
  } else {
    marks.push({ text: `${c.unNumber} ${c.properShippingName} (UN number and proper shipping name)`, ref: '49 CFR 172.301', fromMemory: true });
    marks.push({ text: c.vehicle ? 'Class 9 hazard label' : 'Class 9 lithium battery hazard label', ref: '49 CFR 172.447', fromMemory: true });
    marks.push({ text: 'Shipper and consignee name and address', ref: '49 CFR 172.301', fromMemory: true });
  }
  if (c.damaged) marks.push({ text: '"DAMAGED/DEFECTIVE LITHIUM ION BATTERIES"', ref: '49 CFR 173.185(f)', fromMemory: true });
  if (c.airCargoOnly) marks.push({ text: 'Cargo Aircraft Only label', ref: '49 CFR 172.448; IATA PI 965', fromMemory: true });
  return marks;
}

function cautionsFor(input: LithiumShipmentInput, damaged: boolean, vehicle: boolean, airAlone: boolean): string[] {
  const cautions = [
    'Lithium batteries can overheat and ignite. This summary does not replace the carrier\'s rules, local regulations or a trained dangerous-goods shipper: follow them where they differ.',
    'Protect the terminals against short circuit: cover exposed terminals and connectors with non-conductive caps or tape.',
    'Pack in non-conductive inner packaging with cushioning so the battery cannot move, and a strong rigid outer box.',
    'Only staff trained and certified for dangerous goods may prepare a fully regulated shipment.',
  ];
  if (vehicle) cautions.push('Switch the e-bike off and disconnect or lock the battery so the motor cannot start in transit.');
  // common practice, no source
  if (vehicle && damaged) cautions.push('Take a damaged or defective battery out of the e-bike and ship it on its own as a damaged battery.');
  if (airAlone) cautions.push(`Discharge to a state of charge of ${AIR_MAX_STATE_OF_CHARGE_PCT} % or less before an air shipment.`);
  if (damaged) {
    cautions.push(
      'Keep a damaged or defective battery isolated until it ships: on a non-combustible surface, away from combustibles, and check it for heat or swelling.',
      'If the battery is hot, swollen, smoking, venting or leaking, do not ship it: move it to a safe place outdoors or into a fire-safe container and contact the brand and a hazardous-materials specialist.',
      'No air transport for a damaged or defective battery.',
    );
  } else if (input.direction === 'return') {
    // common practice, no source
    cautions.push('A core is not "damaged or defective" for transport just because it failed a warranty test; treat it as damaged when it is physically damaged, swollen, has taken in water, or shows a safety fault such as overheating. When unsure, ship it as damaged.');
  }
  return cautions;
}

function round1(x: number): string {
  return String(Math.round(x * 10) / 10);
}

function oneOf<T extends string>(value: unknown, allowed: readonly T[], field: string): asserts value is T {
  if (typeof value !== 'string' || !(allowed as readonly string[]).includes(value)) {
    throw new ShippingInputError(field, `${value === undefined ? 'missing' : JSON.stringify(value)}; expected one of ${allowed.join(', ')}`);
  }
}

function positive(value: unknown, field: string, unit: string, max: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new ShippingInputError(field, `expected a number of ${unit} above 0, got ${value === undefined ? 'nothing' : JSON.stringify(value)}`);
  }
  if (value > max) throw new ShippingInputError(field, `${value} ${unit} is not plausible for an e-bike battery (at most ${max} ${unit})`);
}

function range(value: unknown, field: string, min: number, max: number, unit: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
    throw new ShippingInputError(field, `expected ${min}–${max} ${unit}, got ${value === undefined ? 'nothing' : JSON.stringify(value)}`);
  }
}
