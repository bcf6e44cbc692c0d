import { env } from '@/lib/env';
import { startFakeCarrier, type FakeShipment } from '@/scripts/fakes/carrier';

// Integration and browser tests talk to the carrier the app is configured with (CARRIER_URL): the
// stack's local fake. Run on their own, they start that fake in-process on the same address.

let started: Awaited<ReturnType<typeof startFakeCarrier>> | null = null;

export async function ensureCarrier(): Promise<void> {
  const url = new URL(env().CARRIER_URL);
  const up = await fetch(`${url.origin}/health`).then((r) => r.ok, () => false);
  if (up) return;
  started = await startFakeCarrier({ port: Number(url.port), apiKey: env().CARRIER_API_KEY, speed: 60 });
}

export async function stopCarrier(): Promise<void> {
  await started?.close();
  started = null;
}

export async function carrierBookings(reference?: string | null): Promise<FakeShipment[]> {
  const all = (await (await fetch(`${env().CARRIER_URL}/_test/shipments`)).json()) as FakeShipment[];
  return reference === undefined ? all : all.filter((s) => s.reference === reference);
}

/** Moves a parcel on at the fake carrier (every step up to `to` happens now). */
export async function advanceParcel(trackingNumber: string, to: 'picked_up' | 'in_transit' | 'out_for_delivery' | 'delivered' | 'exception'): Promise<void> {
  const res = await fetch(`${env().CARRIER_URL}/_test/shipments/${encodeURIComponent(trackingNumber)}/advance`, { method: 'POST', body: JSON.stringify({ to }) });
  if (!res.ok) throw new Error(`the fake carrier could not advance ${trackingNumber}: ${res.status}`);
}
