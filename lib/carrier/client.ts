import type { CarrierCode, TrackingStatus } from './carriers';

// The one interface the app talks to a carrier through. The local fake (scripts/fakes/carrier.ts)
// and a real carrier integration both sit behind it; lib/carrier/http-client.ts speaks the HTTP
// contract described in lib/carrier/README.md.

export interface PostalAddress {
  name: string;
  line: string;
  city: string;
  postcode: string;
  country: string;
}

/** What the carrier must know about lithium batteries in the parcel (from lib/shipping). */
export interface DangerousGoodsDeclaration {
  unNumber: string;
  properShippingName: string;
  watthours: number;
  fullyRegulated: boolean;
  damaged: boolean;
  /** The shipper confirmed the special packaging for a damaged or defective battery. */
  specialPackagingConfirmed: boolean;
}

export interface ShipmentRequest {
  carrier: CarrierCode;
  service: string;
  /** Our reference printed on the label: the RMA number. */
  reference: string;
  shipFrom: PostalAddress;
  shipTo: PostalAddress;
  parcels: { weightKg: number; description: string }[];
  dangerousGoods?: DangerousGoodsDeclaration[];
  /** A parcel already labelled elsewhere: the carrier checks and tracks this number, no new label. */
  trackingNumber?: string;
  /** collection = the carrier collects at the sender; drop_off = the sender takes it to the carrier. */
  handover: 'collection' | 'drop_off';
  /** Same key → same booking; a repeated request never books twice. */
  idempotencyKey: string;
}

export interface BookedShipment {
  id: string;
  trackingNumber: string;
  /** Null when the parcel was labelled elsewhere. */
  hasLabel: boolean;
}

export interface TrackingEvent {
  status: TrackingStatus;
  description: string;
  location: string;
  at: string;
}

export interface TrackingReport {
  trackingNumber: string;
  status: TrackingStatus;
  events: TrackingEvent[];
}

export interface CarrierClient {
  createShipment(req: ShipmentRequest): Promise<BookedShipment>;
  /** Voids a booking that was not used (a refused step, a re-issued label). */
  cancelShipment(id: string): Promise<void>;
  label(id: string): Promise<Buffer>;
  /** Null when the carrier does not know the number (yet). */
  track(trackingNumber: string): Promise<TrackingReport | null>;
}

/** The carrier refused the request; `message` is theirs, worded for the user. */
export class CarrierRefusal extends Error {
  constructor(message: string, readonly field?: string) {
    super(message);
    this.name = 'CarrierRefusal';
  }
}

/** The carrier could not be reached or answered nonsense; nothing was booked as far as we know. */
export class CarrierUnavailable extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CarrierUnavailable';
  }
}
