import { z } from 'zod';

/** What the dealer has attached to a claim, counted by the server from the claim's uploads. */
export interface EvidenceSummary {
  /** All photos, serial-label photos included. */
  photos: number;
  /** Photos tagged as showing the part's serial label; they count among `photos`. */
  serialLabelPhotos: number;
  /** Load tests run before the repair (dyno runs or battery capacity discharges). */
  beforeTests: number;
  proofOfPurchase: boolean;
  /** The unit is in the brand's registration, which stands in for proof of purchase. */
  registered: boolean;
}

export const MIN_PHOTOS = 2;

const count = (field: string) =>
  z
    .number({ error: `Evidence field "${field}" must be a number.` })
    .int({ error: `Evidence field "${field}" must be a whole number.` })
    .min(0, { error: `Evidence field "${field}" cannot be negative.` });

const flag = (field: string) => z.boolean({ error: `Evidence field "${field}" must be true or false.` });

export const evidenceSummarySchema = z
  .object(
    {
      photos: count('photos'),
      serialLabelPhotos: count('serialLabelPhotos'),
      beforeTests: count('beforeTests'),
      proofOfPurchase: flag('proofOfPurchase'),
      registered: flag('registered'),
    },
    { error: 'The evidence summary is missing.' },
  )
  .refine((e) => e.serialLabelPhotos <= e.photos, {
    error: 'Evidence field "serialLabelPhotos" cannot exceed "photos": serial-label photos are counted among the photos.',
    path: ['serialLabelPhotos'],
  });

/** The first problem with a summary, in words that name the field; null when it is well formed. */
export function evidenceSummaryProblem(input: unknown): string | null {
  const parsed = evidenceSummarySchema.safeParse(input);
  return parsed.success ? null : (parsed.error.issues[0]?.message ?? 'The evidence summary is malformed.');
}

/**
 * The items still missing before a claim can go to the brand, in plain words for the dealer's screen.
 * Empty when the evidence is complete. Throws a TypeError naming the field when the summary is malformed.
 */
export function missingEvidence(summary: EvidenceSummary): string[] {
  const problem = evidenceSummaryProblem(summary);
  if (problem !== null) throw new TypeError(problem);

  const missing: string[] = [];
  if (summary.photos === 0) {
    missing.push('Two photos of the failed part (none uploaded yet)');
  } else if (summary.photos < MIN_PHOTOS) {
    missing.push('One more photo of the failed part (at least two are needed)');
  }
  if (summary.serialLabelPhotos < 1) {
    missing.push('A photo of the serial label, tagged as the serial label (it counts as one of the photos)');
  }
  if (summary.beforeTests < 1) {
    missing.push('A load test from before the repair (a dyno run or a battery capacity discharge)');
  }
  if (!summary.proofOfPurchase && !summary.registered) {
    missing.push('Proof of purchase (the unit is not registered with the brand)');
  }
  return missing;
}
