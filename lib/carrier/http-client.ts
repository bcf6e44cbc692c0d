import { isTrackingStatus } from './carriers';
import { CarrierRefusal, CarrierUnavailable, type BookedShipment, type CarrierClient, type ShipmentRequest, type TrackingReport } from './client';

const TIMEOUT_MS = 10_000;

/** The carrier HTTP contract (lib/carrier/README.md) over fetch; the same code for the fake and a real gateway. */
export function httpCarrierClient(opts: { baseUrl: string; apiKey: string }): CarrierClient {
  const base = opts.baseUrl.replace(/\/+$/, '');

  async function call(path: string, init: RequestInit & { idempotencyKey?: string } = {}): Promise<Response> {
    const headers: Record<string, string> = { authorization: `Bearer ${opts.apiKey}`, accept: 'application/json' };
    if (init.body) headers['content-type'] = 'application/json';
    if (init.idempotencyKey) headers['idempotency-key'] = init.idempotencyKey;
    try {
      return await fetch(`${base}${path}`, { ...init, headers, signal: AbortSignal.timeout(TIMEOUT_MS) });
    } catch (err) {
      throw new CarrierUnavailable(`The carrier could not be reached (${(err as Error).message}).`);
    }
  }

  async function failure(res: Response, what: string): Promise<never> {
    const data = (await res.json().catch(() => ({}))) as { error?: string; field?: string };
    if (res.status === 422 || res.status === 409) throw new CarrierRefusal(data.error ?? `The carrier refused to ${what}.`, data.field);
    throw new CarrierUnavailable(`The carrier answered ${res.status} when asked to ${what}${data.error ? `: ${data.error}` : ''}.`);
  }

  return {
    async createShipment(req: ShipmentRequest): Promise<BookedShipment> {
      const { idempotencyKey, ...body } = req;
      const res = await call('/v1/shipments', { method: 'POST', body: JSON.stringify(body), idempotencyKey });
      if (!res.ok) return failure(res, 'book the shipment');
      const data = (await res.json()) as { id?: unknown; trackingNumber?: unknown; labelUrl?: unknown };
      if (typeof data.id !== 'string' || typeof data.trackingNumber !== 'string') throw new CarrierUnavailable('The carrier answered without a shipment id or tracking number.');
      return { id: data.id, trackingNumber: data.trackingNumber, hasLabel: typeof data.labelUrl === 'string' };
    },

    async cancelShipment(id: string): Promise<void> {
      const res = await call(`/v1/shipments/${encodeURIComponent(id)}`, { method: 'DELETE' });
      if (!res.ok && res.status !== 404) await failure(res, 'cancel the shipment');
    },

    async label(id: string): Promise<Buffer> {
      const res = await call(`/v1/shipments/${encodeURIComponent(id)}/label`);
      if (!res.ok) return failure(res, 'send the label');
      return Buffer.from(await res.arrayBuffer());
    },

    async track(trackingNumber: string): Promise<TrackingReport | null> {
      const res = await call(`/v1/tracking/${encodeURIComponent(trackingNumber)}`);
      if (res.status === 404) return null;
      if (!res.ok) return failure(res, 'report tracking');
      const data = (await res.json()) as TrackingReport;
      if (!isTrackingStatus(data.status) || !Array.isArray(data.events)) throw new CarrierUnavailable('The carrier sent tracking in an unknown shape.');
      return { trackingNumber: data.trackingNumber, status: data.status, events: data.events.filter((e) => isTrackingStatus(e.status)) };
    },
  };
}
