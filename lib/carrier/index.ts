import { env } from '@/lib/env';
import type { CarrierClient } from './client';
import { httpCarrierClient } from './http-client';

export * from './carriers';
export * from './client';
export { httpCarrierClient } from './http-client';

/** The carrier client configured by CARRIER_URL and CARRIER_API_KEY (the local fake by default). */
export function carrierClient(): CarrierClient {
  const e = env();
  return httpCarrierClient({ baseUrl: e.CARRIER_URL, apiKey: e.CARRIER_API_KEY });
}
