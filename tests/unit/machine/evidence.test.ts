// The evidence rule from the product brief ("What a claim carries": photos, at least the serial label and the
// fault; a load test before the repair; proof of purchase unless the sale date comes from the brand's
// registration) as stated in the claim lifecycle assignment: at least two photos, at least one of them tagged
// as the serial label, at least one before-test, proof of purchase unless registered. Our own product rule.
import { describe, expect, it } from 'vitest';
import { missingEvidence, type EvidenceSummary } from '@/lib/claims/evidence';

const PHOTOS_NONE = 'Two photos of the failed part (none uploaded yet)';
const PHOTO_ONE_MORE = 'One more photo of the failed part (at least two are needed)';
const SERIAL = 'A photo of the serial label, tagged as the serial label (it counts as one of the photos)';
const BEFORE = 'A load test from before the repair (a dyno run or a battery capacity discharge)';
const PROOF = 'Proof of purchase (the unit is not registered with the brand)';

const complete: EvidenceSummary = { photos: 2, serialLabelPhotos: 1, beforeTests: 1, proofOfPurchase: true, registered: false };

describe('missingEvidence lists exactly what is missing', () => {
  const cases: Array<[string, EvidenceSummary, string[]]> = [
    ['complete with proof of purchase', complete, []],
    ['registered unit needs no proof of purchase', { ...complete, proofOfPurchase: false, registered: true }, []],
    ['registered and with proof', { ...complete, registered: true }, []],
    ['both photos are serial-label photos', { ...complete, photos: 2, serialLabelPhotos: 2 }, []],
    ['many photos and tests', { ...complete, photos: 9, serialLabelPhotos: 3, beforeTests: 2 }, []],
    ['nothing at all', { photos: 0, serialLabelPhotos: 0, beforeTests: 0, proofOfPurchase: false, registered: false }, [PHOTOS_NONE, SERIAL, BEFORE, PROOF]],
    ['one photo, which is the serial label', { ...complete, photos: 1, serialLabelPhotos: 1 }, [PHOTO_ONE_MORE]],
    ['one photo, not the serial label', { ...complete, photos: 1, serialLabelPhotos: 0 }, [PHOTO_ONE_MORE, SERIAL]],
    ['enough photos but none of the serial label', { ...complete, photos: 5, serialLabelPhotos: 0 }, [SERIAL]],
    ['no before-test', { ...complete, beforeTests: 0 }, [BEFORE]],
    ['unregistered without proof', { ...complete, proofOfPurchase: false }, [PROOF]],
    ['photos fine, nothing else', { photos: 3, serialLabelPhotos: 1, beforeTests: 0, proofOfPurchase: false, registered: false }, [BEFORE, PROOF]],
  ];
  it.each(cases)('%s', (_name, summary, expected) => {
    expect(missingEvidence(summary)).toEqual(expected);
  });
});

describe('a malformed summary is refused with the field named', () => {
  const bad: Array<[string, unknown, RegExp]> = [
    ['negative photos', { ...complete, photos: -1 }, /"photos" cannot be negative/],
    ['fractional before-tests', { ...complete, beforeTests: 1.5 }, /"beforeTests" must be a whole number/],
    ['photos as text', { ...complete, photos: '2' }, /"photos" must be a number/],
    ['more serial-label photos than photos', { ...complete, photos: 1, serialLabelPhotos: 2 }, /"serialLabelPhotos" cannot exceed "photos"/],
    ['registered missing', { photos: 2, serialLabelPhotos: 1, beforeTests: 1, proofOfPurchase: true }, /"registered" must be true or false/],
    ['no summary', undefined, /evidence summary is missing/],
  ];
  it.each(bad)('%s', (_name, summary, message) => {
    expect(() => missingEvidence(summary as EvidenceSummary)).toThrow(message);
  });
});
