import bwipjs from 'bwip-js/node';
import fc from 'fast-check';
import { PDFParse } from 'pdf-parse';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { formatRmaNumber } from '@/lib/credits';
import { code128Png } from '@/lib/documents/barcode';
import { renderPackingSlip, type PackingSlipData } from '@/lib/documents/packing-slip';
import { CODE128_PATTERNS, decodeCode128Image, decodeCode128Runs, runsOfRow } from '../../support/code128-decode';

const RMA = formatRmaNumber({ year: 2026, sequence: 42 });
const SLIP: PackingSlipData = {
  rmaNumber: RMA,
  claimNumber: 'WC-2026-000123-5',
  accountNumber: 'TV-DE-0791',
  from: { name: 'Torvane Drive Systems', line: 'Spoorhaven 14', city: 'Zwolle', postcode: '8011 AB', country: 'NL' },
  shipTo: { name: 'Kettenblatt Radwerk', line: 'Mühlenweg 7', city: 'Freiburg im Breisgau', postcode: '79098', country: 'DE' },
  shipment: { carrier: 'Ferrule Parcel', service: 'Road parcel', trackingNumber: 'FP4821397608', shippedOn: '3 Dec 2026' },
  lines: [{ partNumber: 'TV-BP500', name: 'Frame battery BP500, 36 V 13.9 Ah', quantity: 1 }],
  dealerStockLines: [{ partNumber: 'TV-CH4', name: 'Charger 4 A', quantity: 1 }],
  batteries: [{ partNumber: 'TV-BP500', unNumber: 'UN3480', properShippingName: 'Lithium ion batteries', watthours: 500.4, fullyRegulated: true, marks: ['UN3480 Lithium ion batteries (UN number and proper shipping name)', 'Class 9 lithium battery hazard label'] }],
  batteryCautions: ['Protect the terminals against short circuit.'],
  core: { partNumber: 'TV-BP500', partName: 'Frame battery BP500', serial: 'BP500-2507-06632' },
  printedAt: '3 Dec 2026, 14:05',
};

async function readBack(pdf: Buffer) {
  const parser = new PDFParse({ data: pdf });
  const text = (await parser.getText()).text;
  const images = await parser.getImage({ imageBuffer: true, imageDataUrl: false, imageThreshold: 0 });
  await parser.destroy();
  const img = images.pages[0]!.images[0]!;
  const raw = await sharp(Buffer.from(img.data)).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
  return { text, barcode: decodeCode128Image(raw.data, raw.info.width, raw.info.height, raw.info.channels).text };
}

describe('the packing slip, parsed back', () => {
  it('carries the RMA as text and as a Code 128 barcode that reads back to the same number', async () => {
    const { text, barcode } = await readBack(await renderPackingSlip(SLIP));
    expect(barcode).toBe(RMA);
    for (const s of [RMA, 'WC-2026-000123-5', 'Account TV-DE-0791', 'Kettenblatt Radwerk', 'Mühlenweg 7', '79098 Freiburg im Breisgau', 'Torvane Drive Systems', 'FP4821397608', 'Ferrule Parcel', 'Road parcel', '3 Dec 2026']) {
      expect(text).toContain(s);
    }
    expect(text).toMatch(/1\s+TV-BP500\s+Frame battery BP500, 36 V 13\.9 Ah/);
    expect(text).toMatch(/Not in this box: the dealer fitted these from its own stock/);
    expect(text).toMatch(/TV-BP500: UN3480 Lithium ion batteries, Class 9, 500\.4 Wh, fully regulated/);
    expect(text).toMatch(/serial BP500-2507-06632\) comes back to us under the same RMA number/);
  });

  it('before shipping it is a pick list without carrier or tracking, and without a battery box when none travels', async () => {
    const { text, barcode } = await readBack(await renderPackingSlip({ ...SLIP, shipment: null, batteries: [], batteryCautions: [], lines: [{ partNumber: 'TV-DU85', name: 'Drive unit DU85 (mid motor)', quantity: 1 }] }));
    expect(barcode).toBe(RMA);
    expect(text).toContain('Pick list: not shipped yet');
    expect(text).toContain('not booked yet');
    expect(text).not.toContain('dangerous goods');
  });

  it('any RMA number our format makes reads back from the slip’s barcode (property, fast-check)', async () => {
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 2000, max: 9999 }), fc.integer({ min: 1, max: 9_999_999 }), async (year, sequence) => {
        const rma = formatRmaNumber({ year, sequence });
        const { barcode } = await readBack(await renderPackingSlip({ ...SLIP, rmaNumber: rma }));
        expect(barcode).toBe(rma);
      }),
      { numRuns: 12 },
    );
  }, 30_000);
});

describe('the test’s own Code 128 reader (symbol table typed in from memory of ISO/IEC 15417)', () => {
  it('has 107 distinct symbols of 11 modules with an even number of bar modules; the stop has 13', () => {
    expect(CODE128_PATTERNS).toHaveLength(107);
    expect(new Set(CODE128_PATTERNS).size).toBe(107);
    CODE128_PATTERNS.forEach((p, i) => {
      const w = [...p].map(Number);
      expect(w.reduce((a, b) => a + b, 0), `symbol ${i}`).toBe(i === 106 ? 13 : 11);
      expect((w[0]! + w[2]! + w[4]! + (i === 106 ? w[6]! : 0)) % 2, `symbol ${i}`).toBe(0);
    });
  });

  it('reads what an independent encoder draws, across code sets A, B and C', async () => {
    for (const text of [RMA, 'abc-XYZ', '0123456789', 'SK-4821-3976-G', 'FP4821397608']) {
      const png = await code128Png(text);
      const raw = await sharp(png).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
      expect(decodeCode128Image(raw.data, raw.info.width, raw.info.height, raw.info.channels).text).toBe(text);
    }
    const controlChars = await bwipjs.toBuffer({ bcid: 'code128', text: 'A^009B', parse: true, scale: 2, height: 8, backgroundcolor: 'FFFFFF', paddingwidth: 10 });
    const raw = await sharp(controlChars).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
    expect(decodeCode128Image(raw.data, raw.info.width, raw.info.height, raw.info.channels).text).toBe('A\tB');
  });

  it('refuses a damaged symbol instead of guessing', async () => {
    const png = await code128Png(RMA);
    const raw = await sharp(png).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
    const runs = runsOfRow(raw.data, raw.info.width, Math.floor(raw.info.height / 2), raw.info.channels);
    // Swap two neighbouring bar widths inside a data symbol: still 11 modules, another value, wrong check.
    const hurt = [...runs];
    const i = 8;
    [hurt[i], hurt[i + 2]] = [hurt[i + 2]!, hurt[i]!];
    expect(() => decodeCode128Runs(hurt)).toThrow(/check symbol|unknown pattern/);
    expect(() => decodeCode128Runs(runs.slice(0, -3))).toThrow();
  });
});
