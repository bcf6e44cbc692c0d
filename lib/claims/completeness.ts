// What a claim's details need before it can go to the brand (the evidence rule is in
// ./evidence.ts). Plain words for the dealer's checklist.
export type DraftDetails = {
  partId: string | null;
  failureDate: string | null;
  symptom: string;
  saleDate: string | null;
  registered: boolean;
  modelId: string | null;
  partCategory: string | null;
  batteryCycles: number | null;
  requestedParts: number;
};

export function missingDetails(d: DraftDetails): string[] {
  const missing: string[] = [];
  if (!d.modelId) missing.push('The bike model');
  if (!d.partId) missing.push('The failed part');
  if (!d.failureDate) missing.push('The failure date');
  if (d.symptom.trim().length < 3) missing.push('The symptom the rider noticed');
  if (!d.registered && !d.saleDate) missing.push('The retail sale date (the bike is not registered)');
  if (d.partCategory === 'battery' && d.batteryCycles === null) missing.push('The battery’s charge cycle count (from the display or diagnostic tool)');
  if (d.requestedParts === 0) missing.push('At least one replacement part to request');
  return missing;
}
