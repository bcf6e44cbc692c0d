import PDFDocument from 'pdfkit';
import { code128Png } from './barcode';
import { pdfBuffer, registerDocumentFonts } from './fonts';

export interface SlipAddress {
  name: string;
  line: string;
  city: string;
  postcode: string;
  country: string;
}

export interface SlipLine {
  partNumber: string;
  name: string;
  quantity: number;
}

export interface SlipBattery {
  partNumber: string;
  unNumber: string;
  properShippingName: string;
  watthours: number;
  fullyRegulated: boolean;
  marks: string[];
}

export interface PackingSlipData {
  rmaNumber: string;
  claimNumber: string;
  accountNumber: string;
  from: SlipAddress;
  shipTo: SlipAddress;
  /** Null while the parcel is being picked (the slip then doubles as a pick list). */
  shipment: { carrier: string; service: string; trackingNumber: string; shippedOn: string } | null;
  lines: SlipLine[];
  /** Approved lines the dealer took from its own stock: listed, not in the box. */
  dealerStockLines: SlipLine[];
  batteries: SlipBattery[];
  /** Short safety lines for the batteries (from lib/shipping), printed under the marks. */
  batteryCautions: string[];
  core: { partNumber: string | null; partName: string | null; serial: string } | null;
  printedAt: string;
}

const INK = '#1c2124';
const MUTED = '#626c71';
const LINE = '#d9d4c8';
const SUNK = '#ebe8e0';
const CHARGE = '#176646';
const VOLT = '#8a5d00';
const VOLT_LINE = '#d99a0b';

/**
 * The packing slip that goes in the box: the RMA as text and as a Code 128 barcode (scanned at
 * the dealer and again when the core comes back), both addresses, the lines to pick and tick,
 * and the lithium-battery marks when a battery travels. Our own layout, A4.
 */
export async function renderPackingSlip(d: PackingSlipData): Promise<Buffer> {
  const barcode = await code128Png(d.rmaNumber);
  const doc = new PDFDocument({
    size: 'A4',
    margin: 42,
    info: { Title: `Packing slip ${d.rmaNumber}`, Author: d.from.name, Subject: `Replacement under ${d.rmaNumber} for claim ${d.claimNumber}`, Creator: 'Loadproof' },
  });
  const done = pdfBuffer(doc);
  registerDocumentFonts(doc);
  const left = 42;
  const right = doc.page.width - 42;
  const width = right - left;

  // ---- header: title left, RMA block right
  doc.font('sans-bold').fontSize(9).fillColor(CHARGE).text('LOADPROOF', left, 42, { characterSpacing: 2 });
  doc.font('sans-bold').fontSize(24).fillColor(INK).text('Packing slip', left, 56);
  doc.font('sans').fontSize(10).fillColor(MUTED).text(d.shipment ? 'Replacement part under warranty' : 'Pick list: not shipped yet', left, 88);

  const boxX = right - 232;
  doc.roundedRect(boxX, 40, 232, 100, 6).lineWidth(1).strokeColor(INK).stroke();
  doc.font('sans-bold').fontSize(8).fillColor(MUTED).text('RMA NUMBER', boxX + 12, 50, { characterSpacing: 1 });
  doc.font('mono-bold').fontSize(15).fillColor(INK).text(d.rmaNumber, boxX + 12, 62);
  doc.image(barcode, boxX + 12, 84, { width: 208, height: 44 });

  // ---- addresses
  let y = 156;
  const col = (width - 16) / 2;
  address(doc, 'FROM', d.from, left, y, col);
  address(doc, 'SHIP TO', d.shipTo, left + col + 16, y, col, `Account ${d.accountNumber}`);
  y += 96;

  // ---- shipment facts
  doc.moveTo(left, y).lineTo(right, y).lineWidth(0.75).strokeColor(LINE).stroke();
  y += 10;
  const facts: [string, string][] = d.shipment
    ? [['Carrier', d.shipment.carrier], ['Service', d.shipment.service], ['Tracking number', d.shipment.trackingNumber], ['Shipped on', d.shipment.shippedOn]]
    : [['Carrier', '—'], ['Service', '—'], ['Tracking number', 'not booked yet'], ['Shipped on', '—']];
  facts.push(['Claim', d.claimNumber]);
  const factW = width / facts.length;
  facts.forEach(([k, v], i) => {
    doc.font('sans-bold').fontSize(7.5).fillColor(MUTED).text(k.toUpperCase(), left + i * factW, y, { width: factW - 6, characterSpacing: 0.5 });
    doc.font(k === 'Tracking number' || k === 'Claim' ? 'mono' : 'sans').fontSize(9.5).fillColor(INK).text(v, left + i * factW, y + 11, { width: factW - 6 });
  });
  y += 38;
  doc.moveTo(left, y).lineTo(right, y).lineWidth(0.75).strokeColor(LINE).stroke();
  y += 16;

  // ---- lines
  doc.font('sans-bold').fontSize(12).fillColor(INK).text('In this box', left, y);
  y += 20;
  const cols = { tick: left + 8, qty: left + 46, part: left + 86, name: left + 200 };
  doc.rect(left, y, width, 18).fillColor(SUNK).fill();
  doc.font('sans-bold').fontSize(8).fillColor(MUTED);
  doc.text('PICKED', cols.tick - 4, y + 5.5);
  doc.text('QTY', cols.qty, y + 5.5);
  doc.text('PART NUMBER', cols.part, y + 5.5);
  doc.text('DESCRIPTION', cols.name, y + 5.5);
  y += 24;
  for (const line of d.lines) {
    const h = Math.max(16, doc.font('sans').fontSize(10).heightOfString(line.name, { width: right - cols.name }));
    doc.rect(cols.tick + 4, y - 1, 11, 11).lineWidth(1).strokeColor(INK).stroke();
    doc.font('mono-bold').fontSize(10).fillColor(INK).text(String(line.quantity), cols.qty, y);
    doc.font('mono').fontSize(10).text(line.partNumber, cols.part, y);
    doc.font('sans').fontSize(10).text(line.name, cols.name, y, { width: right - cols.name });
    y += h + 6;
    doc.moveTo(left, y - 3).lineTo(right, y - 3).lineWidth(0.5).strokeColor(LINE).stroke();
  }
  if (!d.lines.length) {
    doc.font('sans').fontSize(10).fillColor(MUTED).text('No parts to send.', cols.qty, y);
    y += 18;
  }
  if (d.dealerStockLines.length) {
    y += 4;
    doc.font('sans-bold').fontSize(9).fillColor(MUTED).text('Not in this box: the dealer fitted these from its own stock and is credited for them', left, y, { width });
    y += 14;
    for (const line of d.dealerStockLines) {
      doc.font('mono').fontSize(9).fillColor(MUTED).text(`${line.quantity} × ${line.partNumber}`, cols.qty, y);
      doc.font('sans').fontSize(9).text(line.name, cols.name, y, { width: right - cols.name });
      y += 14;
    }
  }
  y += 12;

  // ---- lithium batteries
  if (d.batteries.length) {
    const text = d.batteries.map(
      (b) => `${b.partNumber}: ${b.unNumber} ${b.properShippingName}, Class 9, ${round1(b.watthours)} Wh, ${b.fullyRegulated ? 'fully regulated' : 'small-battery provisions'}. Marks: ${b.marks.join('; ')}.`,
    );
    const cautions = d.batteryCautions.map((c) => `• ${c}`);
    doc.font('sans').fontSize(9);
    const bodyH = [...text, ...cautions].reduce((h, t) => h + doc.heightOfString(t, { width: width - 24 }) + 4, 0);
    const boxH = 30 + bodyH;
    doc.roundedRect(left, y, width, boxH, 6).lineWidth(1.5).strokeColor(VOLT_LINE).stroke();
    doc.font('sans-bold').fontSize(11).fillColor(VOLT).text('Lithium batteries: dangerous goods', left + 12, y + 10);
    let by = y + 28;
    for (const t of text) {
      doc.font('sans-bold').fontSize(9).fillColor(INK).text(t, left + 12, by, { width: width - 24 });
      by += doc.heightOfString(t, { width: width - 24 }) + 4;
    }
    for (const c of cautions) {
      doc.font('sans').fontSize(9).fillColor(INK).text(c, left + 12, by, { width: width - 24 });
      by += doc.heightOfString(c, { width: width - 24 }) + 4;
    }
    y += boxH + 14;
  }

  // ---- the core goes back
  if (d.core) {
    doc.font('sans-bold').fontSize(12).fillColor(INK).text('Send the failed part back', left, y);
    y += 18;
    const part = [d.core.partNumber, d.core.partName].filter(Boolean).join(' ') || 'The failed part';
    const serial = d.core.serial ? ` (serial ${d.core.serial})` : '';
    const body = `${part}${serial} comes back to us under the same RMA number. Use the prepaid return label on the claim in Loadproof and put a copy of this slip in the box, so we can scan the RMA when it arrives.`;
    doc.font('sans').fontSize(10).fillColor(INK).text(body, left, y, { width });
    y += doc.heightOfString(body, { width }) + 10;
  }

  doc.font('sans').fontSize(8).fillColor(MUTED).text(`Printed ${d.printedAt} · ${d.from.name} · claim ${d.claimNumber}`, left, doc.page.height - 56, { width, lineBreak: false });
  doc.end();
  return done;
}

function address(doc: PDFKit.PDFDocument, title: string, a: SlipAddress, x: number, y: number, w: number, extra?: string) {
  doc.font('sans-bold').fontSize(8).fillColor(MUTED).text(title, x, y, { characterSpacing: 1 });
  doc.font('sans-bold').fontSize(12).fillColor(INK).text(a.name, x, y + 13, { width: w });
  doc.font('sans').fontSize(10).fillColor(INK).text([a.line, `${a.postcode} ${a.city}`.trim(), a.country].filter(Boolean).join('\n'), x, y + 31, { width: w });
  if (extra) doc.font('mono').fontSize(9).fillColor(MUTED).text(extra, x, y + 76, { width: w });
}

function round1(x: number): string {
  return String(Math.round(x * 10) / 10);
}
