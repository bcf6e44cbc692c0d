import type { TransportService } from '@/lib/shipping';

// The carriers the app knows, their services and their tracking-number formats. Pure.
// Both carriers, their service names and their number formats are our own inventions for the
// local fake; a real carrier is added here with its real formats when it is integrated.

export type CarrierCode = 'ferrule' | 'skeinway';

/** Skeinway check letters: 23 letters, no I, O or Z, which are read as 1, 0 and 2. */
const SKEINWAY_LETTERS = 'ABCDEFGHJKLMNPQRSTUVWXY';

export interface CarrierService {
  code: string;
  name: string;
  /** How the parcel travels, in the terms of the lithium-battery rules (lib/shipping). */
  transport: TransportService;
  /** Typical business days door to door, for the screen. */
  days: string;
  /**
   * The carrier's own rule: does this service take fully regulated Class 9 lithium batteries?
   * Stricter than the regulations on purpose (carriers often are).
   */
  takesFullyRegulatedLithium: boolean;
}

export interface TrackingFormat {
  /** For messages and hints: how a number of this carrier looks. */
  describe: string;
  example: string;
}

export interface Carrier {
  code: CarrierCode;
  name: string;
  services: CarrierService[];
  tracking: TrackingFormat;
}

export const CARRIERS: Record<CarrierCode, Carrier> = {
  ferrule: {
    code: 'ferrule',
    name: 'Ferrule Parcel',
    services: [
      { code: 'road', name: 'Road parcel', transport: 'ground', days: '2–4 business days', takesFullyRegulatedLithium: true },
      // Next-day parcels fly in the hold of passenger flights.
      { code: 'next_day_air', name: 'Next-day air', transport: 'air_passenger_aircraft', days: '1 business day', takesFullyRegulatedLithium: false },
    ],
    tracking: { describe: `FP followed by 10 digits, the last a check digit (like ${ferruleNumber(482139760)})`, example: ferruleNumber(482139760) },
  },
  skeinway: {
    code: 'skeinway',
    name: 'Skeinway Express',
    services: [
      { code: 'ground', name: 'Ground freight', transport: 'ground', days: '3–5 business days', takesFullyRegulatedLithium: true },
      { code: 'air_freighter', name: 'Air freighter', transport: 'air_cargo_aircraft', days: '1–2 business days', takesFullyRegulatedLithium: true },
    ],
    tracking: { describe: `SK, 4 digits, 4 digits and a check letter (like ${skeinwayNumber(48213976)})`, example: skeinwayNumber(48213976) },
  },
};

export const CARRIER_CODES = Object.keys(CARRIERS) as CarrierCode[];

export function isCarrierCode(value: unknown): value is CarrierCode {
  return typeof value === 'string' && (CARRIER_CODES as string[]).includes(value);
}

export function carrierName(code: string): string {
  return isCarrierCode(code) ? CARRIERS[code].name : code;
}

export function findService(carrier: string, service: string): CarrierService | null {
  if (!isCarrierCode(carrier)) return null;
  return CARRIERS[carrier].services.find((s) => s.code === service) ?? null;
}

// ---- tracking numbers ----

/** Ferrule: weights 3, 1, 3, 1… from the left over the 9 serial digits; check = (10 − sum mod 10) mod 10. */
export function ferruleCheckDigit(serial: string): number {
  let sum = 0;
  for (let i = 0; i < serial.length; i++) sum += (serial.charCodeAt(i) - 48) * (i % 2 === 0 ? 3 : 1);
  return (10 - (sum % 10)) % 10;
}

/** Skeinway: sum of digit × (position + 2) over the 8 digits, mod 23, as a letter. */
export function skeinwayCheckLetter(digits: string): string {
  let sum = 0;
  for (let i = 0; i < digits.length; i++) sum += (digits.charCodeAt(i) - 48) * (i + 2);
  return SKEINWAY_LETTERS[sum % 23]!;
}

export function ferruleNumber(serial: number): string {
  if (!Number.isSafeInteger(serial) || serial < 0 || serial > 999_999_999) throw new RangeError(`serial ${serial} is not 0–999999999`);
  const s = String(serial).padStart(9, '0');
  return `FP${s}${ferruleCheckDigit(s)}`;
}

export function skeinwayNumber(serial: number): string {
  if (!Number.isSafeInteger(serial) || serial < 0 || serial > 99_999_999) throw new RangeError(`serial ${serial} is not 0–99999999`);
  const s = String(serial).padStart(8, '0');
  return `SK-${s.slice(0, 4)}-${s.slice(4)}-${skeinwayCheckLetter(s)}`;
}

/** A new tracking number for a carrier from a serial (the fake carrier's counter). */
export function makeTrackingNumber(carrier: CarrierCode, serial: number): string {
  return carrier === 'ferrule' ? ferruleNumber(serial % 1_000_000_000) : skeinwayNumber(serial % 100_000_000);
}

export type TrackingCheck = { ok: true; canonical: string } | { ok: false; message: string };

/**
 * Reads a tracking number as people type or scan it (any case, spaces or dashes) and checks it
 * against the carrier's format and check character. The canonical form is what is stored.
 */
export function checkTrackingNumber(carrier: string, raw: string): TrackingCheck {
  if (!isCarrierCode(carrier)) return { ok: false, message: `"${carrier}" is not a carrier we ship with.` };
  const c = CARRIERS[carrier];
  const text = String(raw ?? '').trim();
  if (!text) return { ok: false, message: `Enter the ${c.name} tracking number: ${c.tracking.describe}.` };
  const compact = text.toUpperCase().replace(/[\s\-_.]/g, '');
  const wrong = { ok: false as const, message: `"${text}" is not a ${c.name} tracking number: ${c.tracking.describe}.` };
  if (carrier === 'ferrule') {
    const m = /^FP(\d{9})(\d)$/.exec(compact);
    if (!m) return wrong;
    if (ferruleCheckDigit(m[1]!) !== Number(m[2])) return { ok: false, message: `"${text}": the check digit does not match; the number is mistyped.` };
    return { ok: true, canonical: compact };
  }
  const m = /^SK(\d{8})([A-Z])$/.exec(compact);
  if (!m) return wrong;
  if (skeinwayCheckLetter(m[1]!) !== m[2]) return { ok: false, message: `"${text}": the check letter does not match; the number is mistyped.` };
  return { ok: true, canonical: `SK-${m[1]!.slice(0, 4)}-${m[1]!.slice(4)}-${m[2]}` };
}

// ---- tracking status: our own words ----

export const TRACKING_STATUSES = ['label_created', 'picked_up', 'in_transit', 'out_for_delivery', 'delivered', 'exception'] as const;
export type TrackingStatus = (typeof TRACKING_STATUSES)[number];

export const TRACKING_LABELS: Record<TrackingStatus, string> = {
  label_created: 'Label created, waiting for the carrier',
  picked_up: 'Collected by the carrier',
  in_transit: 'In transit',
  out_for_delivery: 'Out for delivery',
  delivered: 'Delivered',
  exception: 'Held up: the carrier reports a problem',
};

/** The three words the dealer follows: shipped, in transit, delivered. */
export function dealerTrackingWord(status: TrackingStatus): 'shipped' | 'in transit' | 'delivered' | 'held up' {
  if (status === 'delivered') return 'delivered';
  if (status === 'exception') return 'held up';
  if (status === 'label_created') return 'shipped';
  return 'in transit';
}

export function isTrackingStatus(value: unknown): value is TrackingStatus {
  return typeof value === 'string' && (TRACKING_STATUSES as readonly string[]).includes(value);
}
