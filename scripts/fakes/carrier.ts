// A local stand-in for a parcel carrier's API, speaking the contract in lib/carrier/README.md:
// it books shipments (checking tracking-number formats and its own dangerous-goods rules),
// hands out tracking numbers and label PDFs, and reports tracking events that unfold with time.
//
// Time: every shipment follows a fixed schedule in carrier hours after booking; `speed` carrier
// hours pass per real hour (LOCAL_CARRIER_SPEED, default 60: one carrier hour per real minute).
// Tests move a parcel on at once with POST /_test/shipments/:trackingNumber/advance {"to":"delivered"}.
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import PDFDocument from 'pdfkit';
import {
  CARRIERS,
  TRACKING_STATUSES,
  checkTrackingNumber,
  findService,
  isCarrierCode,
  makeTrackingNumber,
  type CarrierCode,
  type TrackingStatus,
} from '../../lib/carrier/carriers';
import type { DangerousGoodsDeclaration, PostalAddress, TrackingEvent } from '../../lib/carrier/client';
import { code128Png } from '../../lib/documents/barcode';
import { pdfBuffer, registerDocumentFonts } from '../../lib/documents/fonts';

type Handover = 'collection' | 'drop_off';

export type FakeShipment = {
  id: string;
  carrier: CarrierCode;
  service: string;
  trackingNumber: string;
  reference: string;
  shipFrom: PostalAddress;
  shipTo: PostalAddress;
  parcels: { weightKg: number; description: string }[];
  dangerousGoods: DangerousGoodsDeclaration[];
  handover: Handover;
  hasLabel: boolean;
  idempotencyKey: string | null;
  createdAt: string;
  cancelledAt: string | null;
  /** Set by the test endpoint: steps made to happen early, each at the moment it was forced. */
  forced: Partial<Record<TrackingStatus, string>>;
};

type Store = { serial: number; shipments: FakeShipment[] };

/** Carrier hours after booking at which each step happens. A drop-off parcel waits a day for the sender. */
function schedule(s: FakeShipment): [TrackingStatus, number][] {
  const air = findService(s.carrier, s.service)?.transport !== 'ground';
  const wait = s.handover === 'drop_off' ? 24 : 0;
  return air
    ? [['picked_up', wait + 1], ['in_transit', wait + 3], ['out_for_delivery', wait + 9], ['delivered', wait + 12]]
    : [['picked_up', wait + 2], ['in_transit', wait + 5], ['out_for_delivery', wait + 20], ['delivered', wait + 24]];
}

function describe(s: FakeShipment, status: TrackingStatus): { description: string; location: string } {
  const name = CARRIERS[s.carrier].name;
  switch (status) {
    case 'picked_up':
      return { description: s.handover === 'drop_off' ? `Handed in at a ${name} point` : `Collected by ${name}`, location: s.shipFrom.city };
    case 'in_transit':
      return { description: 'Sorted and on its way', location: `${name} hub, ${s.shipTo.country}` };
    case 'out_for_delivery':
      return { description: 'On the van for delivery today', location: s.shipTo.city };
    case 'delivered':
      return { description: `Delivered to ${s.shipTo.name}`, location: s.shipTo.city };
    case 'exception':
      return { description: 'Delivery held up: address or access problem, the carrier will retry', location: s.shipTo.city };
    default:
      return { description: 'Label created', location: s.shipFrom.city };
  }
}

export function trackingOf(s: FakeShipment, nowMs: number, speed: number): { status: TrackingStatus; events: TrackingEvent[] } {
  const created = Date.parse(s.createdAt);
  const hourMs = 3_600_000 / speed;
  const events: TrackingEvent[] = [{ status: 'label_created', ...describe(s, 'label_created'), at: s.createdAt }];
  for (const [status, hours] of schedule(s)) {
    const natural = created + hours * hourMs;
    const forced = s.forced[status] ? Date.parse(s.forced[status]) : Infinity;
    const at = Math.min(natural, forced);
    if (at <= nowMs) events.push({ status, ...describe(s, status), at: new Date(at).toISOString() });
  }
  if (s.forced.exception && Date.parse(s.forced.exception) <= nowMs) events.push({ status: 'exception', ...describe(s, 'exception'), at: s.forced.exception });
  events.sort((a, b) => Date.parse(a.at) - Date.parse(b.at));
  return { status: events[events.length - 1]!.status, events };
}

function addressProblem(a: unknown, field: string): string | null {
  if (typeof a !== 'object' || a === null) return `${field}: an address is required`;
  for (const k of ['name', 'line', 'city', 'country'] as const) {
    const v = (a as Record<string, unknown>)[k];
    if (typeof v !== 'string' || !v.trim()) return `${field}.${k}: required`;
  }
  return null;
}

/** The carrier's own acceptance rules for lithium batteries (it refuses what the rules forbid, and more). */
function dangerousGoodsProblem(carrier: CarrierCode, serviceCode: string, dg: DangerousGoodsDeclaration[]): string | null {
  const service = findService(carrier, serviceCode)!;
  for (const d of dg) {
    if (d.damaged && service.transport !== 'ground') return 'We do not fly damaged or defective lithium batteries; book a ground service.';
    if (d.damaged && !d.specialPackagingConfirmed) return 'A damaged or defective lithium battery needs the shipper\'s confirmation of its special packaging before we issue a label.';
    if (d.unNumber === 'UN3480' && service.transport === 'air_passenger_aircraft') return `${service.name} flies on passenger aircraft, which may not carry UN3480 lithium ion batteries shipped alone.`;
    if (d.fullyRegulated && !service.takesFullyRegulatedLithium) return `${service.name} does not take fully regulated Class 9 lithium batteries.`;
  }
  return null;
}

async function renderLabel(s: FakeShipment): Promise<Buffer> {
  // 4 × 6 inch thermal label.
  const doc = new PDFDocument({ size: [288, 432], margin: 14 });
  const done = pdfBuffer(doc);
  registerDocumentFonts(doc);
  const carrier = CARRIERS[s.carrier];
  const service = findService(s.carrier, s.service)!;
  doc.rect(0, 0, 288, 40).fill('#1c2124');
  doc.font('sans-bold').fontSize(16).fillColor('#ffffff').text(carrier.name.toUpperCase(), 14, 12, { characterSpacing: 1 });
  doc.font('sans-bold').fontSize(10).fillColor('#1c2124').text(service.name + (s.handover === 'drop_off' ? ' · prepaid return' : ''), 14, 50);
  doc.font('sans').fontSize(7).fillColor('#626c71').text('FROM', 14, 68);
  doc.font('sans').fontSize(8).fillColor('#1c2124').text([s.shipFrom.name, s.shipFrom.line, `${s.shipFrom.postcode ?? ''} ${s.shipFrom.city}`.trim(), s.shipFrom.country].join('\n'), 14, 78, { width: 260 });
  doc.font('sans').fontSize(7).fillColor('#626c71').text('TO', 14, 126);
  doc.font('sans-bold').fontSize(12).fillColor('#1c2124').text([s.shipTo.name, s.shipTo.line, `${s.shipTo.postcode ?? ''} ${s.shipTo.city}`.trim(), s.shipTo.country].join('\n'), 14, 136, { width: 260 });
  doc.image(await code128Png(s.trackingNumber, { heightMm: 16 }), 14, 214, { width: 260, height: 60 });
  doc.font('sans-bold').fontSize(12).text(s.trackingNumber, 14, 280, { width: 260, align: 'center' });
  doc.font('sans').fontSize(8).text(`Ref ${s.reference}`, 14, 298, { width: 260, align: 'center' });
  let y = 316;
  for (const d of s.dangerousGoods) {
    doc.rect(14, y, 260, d.damaged ? 56 : 40).lineWidth(2).strokeColor('#1c2124').stroke();
    doc.font('sans-bold').fontSize(9).fillColor('#1c2124').text(`${d.unNumber} ${d.properShippingName} · Class 9 · ${d.watthours} Wh`, 20, y + 6, { width: 248 });
    doc.font('sans').fontSize(8).text(d.fullyRegulated ? 'Fully regulated dangerous goods' : 'Lithium battery mark applies', 20, y + 22, { width: 248 });
    if (d.damaged) doc.font('sans-bold').fontSize(9).text('DAMAGED/DEFECTIVE LITHIUM ION BATTERIES · GROUND ONLY', 20, y + 36, { width: 248 });
    y += (d.damaged ? 56 : 40) + 6;
  }
  doc.font('sans').fontSize(6).fillColor('#626c71').text('Local test carrier: not a real shipping label.', 14, 418, { width: 260, align: 'center' });
  doc.end();
  return done;
}

export async function startFakeCarrier(opts: { port: number; apiKey: string; file?: string; speed?: number }) {
  const speed = opts.speed ?? 60;
  let store: Store = { serial: Math.floor(Math.random() * 9e7) + 1e6, shipments: [] };
  if (opts.file && fs.existsSync(opts.file)) store = JSON.parse(fs.readFileSync(opts.file, 'utf8')) as Store;
  const save = () => {
    if (!opts.file) return;
    fs.mkdirSync(path.dirname(opts.file), { recursive: true });
    fs.writeFileSync(opts.file, JSON.stringify(store));
  };
  const byTracking = (n: string) => {
    for (const carrier of Object.keys(CARRIERS)) {
      const c = checkTrackingNumber(carrier, n);
      if (c.ok) return store.shipments.find((s) => s.trackingNumber === c.canonical && !s.cancelledAt) ?? null;
    }
    return null;
  };

  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://localhost');
    const send = (status: number, body: unknown) => {
      res.writeHead(status, { 'content-type': 'application/json' });
      res.end(JSON.stringify(body));
    };
    const readJson = () =>
      new Promise<Record<string, unknown>>((resolve) => {
        let raw = '';
        req.on('data', (c) => (raw += c));
        req.on('end', () => {
          try {
            const v = JSON.parse(raw || '{}');
            resolve(typeof v === 'object' && v !== null ? v : {});
          } catch {
            resolve({ __invalid: true });
          }
        });
      });

    void (async () => {
      if (url.pathname === '/health') return send(200, { ok: true });
      // Test-only controls: no key needed, loopback only.
      const advance = url.pathname.match(/^\/_test\/shipments\/([^/]+)\/advance$/);
      if (advance && req.method === 'POST') {
        const s = byTracking(decodeURIComponent(advance[1]!));
        if (!s) return send(404, { error: 'no such tracking number' });
        const body = await readJson();
        const to = body.to;
        if (typeof to !== 'string' || !(TRACKING_STATUSES as readonly string[]).includes(to)) return send(422, { error: `to: one of ${TRACKING_STATUSES.join(', ')}` });
        // Every step up to `to` that has not happened yet happens now; earlier forced times stay.
        const now = new Date().toISOString();
        const happened = new Set(trackingOf(s, Date.now(), speed).events.map((e) => e.status));
        if (to === 'exception') s.forced.exception ??= now;
        else for (const [status] of to === 'label_created' ? [] : schedule(s)) {
          if (!happened.has(status)) s.forced[status] ??= now;
          if (status === to) break;
        }
        save();
        return send(200, { trackingNumber: s.trackingNumber, ...trackingOf(s, Date.now(), speed) });
      }
      if (url.pathname === '/_test/shipments' && req.method === 'GET') return send(200, store.shipments);

      if (req.headers.authorization !== `Bearer ${opts.apiKey}`) return send(401, { error: 'missing or wrong API key' });

      if (url.pathname === '/v1/shipments' && req.method === 'POST') {
        const body = await readJson();
        if (body.__invalid) return send(400, { error: 'body is not JSON' });
        const key = typeof req.headers['idempotency-key'] === 'string' ? req.headers['idempotency-key'] : null;
        const again = key ? store.shipments.find((s) => s.idempotencyKey === key && !s.cancelledAt) : undefined;
        if (again) return send(200, view(again));
        const { carrier, service, reference, shipFrom, shipTo, parcels, handover } = body as Record<string, unknown>;
        if (!isCarrierCode(carrier)) return send(422, { error: `carrier: unknown (${Object.keys(CARRIERS).join(', ')})`, field: 'carrier' });
        if (typeof service !== 'string' || !findService(carrier, service)) return send(422, { error: `${CARRIERS[carrier].name} has no service "${String(service)}".`, field: 'service' });
        if (typeof reference !== 'string' || !reference.trim()) return send(422, { error: 'reference: required', field: 'reference' });
        const addr = addressProblem(shipFrom, 'shipFrom') ?? addressProblem(shipTo, 'shipTo');
        if (addr) return send(422, { error: addr, field: addr.split(/[.:]/)[0] });
        if (!Array.isArray(parcels) || parcels.length < 1) return send(422, { error: 'parcels: at least one', field: 'parcels' });
        if (handover !== 'collection' && handover !== 'drop_off') return send(422, { error: 'handover: collection or drop_off', field: 'handover' });
        const dg = (Array.isArray(body.dangerousGoods) ? body.dangerousGoods : []) as DangerousGoodsDeclaration[];
        const dgProblem = dangerousGoodsProblem(carrier, service, dg);
        if (dgProblem) return send(422, { error: dgProblem, field: 'dangerousGoods' });
        let trackingNumber: string;
        let hasLabel = true;
        if (body.trackingNumber !== undefined && body.trackingNumber !== null && body.trackingNumber !== '') {
          const check = checkTrackingNumber(carrier, String(body.trackingNumber));
          if (!check.ok) return send(422, { error: check.message, field: 'trackingNumber' });
          if (byTracking(check.canonical)) return send(409, { error: `Tracking number ${check.canonical} is already in use.`, field: 'trackingNumber' });
          trackingNumber = check.canonical;
          hasLabel = false;
        } else {
          store.serial += 1;
          trackingNumber = makeTrackingNumber(carrier, store.serial);
        }
        const s: FakeShipment = {
          id: `shp_${randomUUID().replace(/-/g, '').slice(0, 20)}`,
          carrier, service, trackingNumber, reference, shipFrom: shipFrom as PostalAddress, shipTo: shipTo as PostalAddress,
          parcels: parcels as FakeShipment['parcels'], dangerousGoods: dg, handover, hasLabel, idempotencyKey: key,
          createdAt: new Date().toISOString(), cancelledAt: null, forced: {},
        };
        store.shipments.push(s);
        save();
        return send(201, view(s));
      }

      const one = url.pathname.match(/^\/v1\/shipments\/([^/]+)(\/label)?$/);
      if (one) {
        const s = store.shipments.find((x) => x.id === one[1]);
        if (!s) return send(404, { error: 'no such shipment' });
        if (one[2] && req.method === 'GET') {
          if (!s.hasLabel) return send(404, { error: 'this parcel was labelled elsewhere' });
          const pdf = await renderLabel(s);
          res.writeHead(200, { 'content-type': 'application/pdf', 'content-length': pdf.length });
          return res.end(pdf);
        }
        if (!one[2] && req.method === 'GET') return send(200, view(s));
        if (!one[2] && req.method === 'DELETE') {
          if (trackingOf(s, Date.now(), speed).status !== 'label_created') return send(409, { error: 'The parcel is already with us; it cannot be cancelled.' });
          s.cancelledAt ??= new Date().toISOString();
          save();
          return send(200, { id: s.id, cancelled: true });
        }
      }

      const track = url.pathname.match(/^\/v1\/tracking\/([^/]+)$/);
      if (track && req.method === 'GET') {
        const s = byTracking(decodeURIComponent(track[1]!));
        if (!s) return send(404, { error: 'unknown tracking number' });
        return send(200, { trackingNumber: s.trackingNumber, carrier: s.carrier, ...trackingOf(s, Date.now(), speed) });
      }
      send(404, { error: 'not found' });
    })().catch((err: Error) => send(500, { error: err.message }));
  });

  function view(s: FakeShipment) {
    return {
      id: s.id, carrier: s.carrier, service: s.service, trackingNumber: s.trackingNumber, reference: s.reference,
      labelUrl: s.hasLabel ? `/v1/shipments/${s.id}/label` : null, createdAt: s.createdAt, cancelled: !!s.cancelledAt,
    };
  }

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, '127.0.0.1', () => resolve());
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : opts.port;
  return {
    port,
    url: `http://127.0.0.1:${port}`,
    shipments: () => store.shipments,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
