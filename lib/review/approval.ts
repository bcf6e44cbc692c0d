import { parseAmount, toDecimalString, type CurrencyCode } from '@/lib/money';
import { FREIGHT_LINE_ID, hoursText, hundredthsOf, type ClaimLines, type LaborLine, type PartLine } from './lines';

/** What the rep sends for each requested line: a quantity, an operation and its hours, the freight. */
export type ApprovalDraft = {
  parts: { lineId: string; quantity: number }[];
  labor: { lineId: string; operationId: string; hours: string }[];
  /** The freight allowance as written, in the brand's currency ("18.50"); empty means none. */
  freight: string;
};

/** One operation of the brand's labor schedule. */
export type ScheduleOperation = { id: string; code: string; description: string; standardHours: string; active: boolean };

export type LineStatus = 'as_requested' | 'changed' | 'not_approved';

export type LineComparison =
  | { kind: 'part'; lineId: string; status: LineStatus; partNumber: string; name: string; requestedQuantity: number; approvedQuantity: number }
  | {
      kind: 'labor';
      lineId: string;
      status: LineStatus;
      requested: { code: string; description: string; hours: string };
      approved: { code: string; description: string; hours: string } | null;
    }
  | { kind: 'freight'; lineId: typeof FREIGHT_LINE_ID; status: LineStatus; requestedMinor: number; approvedMinor: number };

/** The line verdicts the claim machine records for an approval. */
export type MachineLine = { lineId: string; approved: boolean; changed?: boolean; note?: string };

export type ApprovalOutcome =
  | { ok: true; extent: 'full' | 'partial'; approved: ClaimLines; lines: MachineLine[]; comparison: LineComparison[] }
  | { ok: false; message: string; fieldErrors: Record<string, string[]> };

/**
 * Lines approved against lines requested, line by line. A line missing from the approval was not
 * approved; a line kept with a lower quantity, fewer hours, another operation or less freight was
 * changed. Freight appears only when the dealer asked for some.
 */
export function compareLines(requested: ClaimLines, approved: ClaimLines | null): LineComparison[] {
  const out: LineComparison[] = [];
  for (const p of requested.parts) {
    const a = approved?.parts.find((x) => x.lineId === p.lineId);
    const qty = approved ? (a?.quantity ?? 0) : p.quantity;
    out.push({
      kind: 'part', lineId: p.lineId, partNumber: p.partNumber, name: p.name, requestedQuantity: p.quantity, approvedQuantity: qty,
      status: qty === 0 ? 'not_approved' : qty === p.quantity ? 'as_requested' : 'changed',
    });
  }
  for (const l of requested.labor) {
    const a = approved ? approved.labor.find((x) => x.lineId === l.lineId) ?? null : l;
    const same = a !== null && a.operationId === l.operationId && hundredthsOf(a.hours) === hundredthsOf(l.hours);
    out.push({
      kind: 'labor', lineId: l.lineId,
      requested: { code: l.code, description: l.description, hours: l.hours },
      approved: a && { code: a.code, description: a.description, hours: a.hours },
      status: a === null ? 'not_approved' : same ? 'as_requested' : 'changed',
    });
  }
  if (requested.freightMinor > 0) {
    const f = approved ? approved.freightMinor : requested.freightMinor;
    out.push({
      kind: 'freight', lineId: FREIGHT_LINE_ID, requestedMinor: requested.freightMinor, approvedMinor: f,
      status: f === 0 ? 'not_approved' : f === requested.freightMinor ? 'as_requested' : 'changed',
    });
  }
  return out;
}

/** The change on one line in a few words, for the event log and e-mail ("quantity 2 → 1"). */
export function describeChange(c: LineComparison, currency: CurrencyCode): string | null {
  if (c.status === 'as_requested') return null;
  switch (c.kind) {
    case 'part':
      return c.status === 'not_approved'
        ? `${c.partNumber}: not approved (asked ${c.requestedQuantity})`
        : `${c.partNumber}: quantity ${c.requestedQuantity} → ${c.approvedQuantity}`;
    case 'labor':
      if (c.approved === null) return `${c.requested.code}: not approved (asked ${c.requested.hours} h)`;
      return c.approved.code === c.requested.code
        ? `${c.requested.code}: ${c.requested.hours} h → ${c.approved.hours} h`
        : `${c.requested.code} ${c.requested.hours} h → ${c.approved.code} ${c.approved.hours} h`;
    case 'freight': {
      const money = (m: number) => `${toDecimalString(m, currency)} ${currency}`;
      return c.status === 'not_approved' ? `Freight: not approved (asked ${money(c.requestedMinor)})` : `Freight: ${money(c.requestedMinor)} → ${money(c.approvedMinor)}`;
    }
  }
}

/**
 * Checks a rep's approval against the claim's request and the brand's labor schedule and builds
 * the approved lines. Refused, with a message per field: a quantity that is negative, not whole or
 * more than requested; an operation not in the schedule; hours that are negative, malformed or more
 * than the schedule allows for the operation; freight that is negative or more than requested; a
 * requested line left unanswered or a line the claim does not have; nothing approved at all.
 */
export function buildApproval(
  requested: ClaimLines,
  draft: ApprovalDraft,
  schedule: readonly ScheduleOperation[],
  currency: CurrencyCode,
): ApprovalOutcome {
  const errors: Record<string, string[]> = {};
  const fail = (key: string, message: string) => (errors[key] ??= []).push(message);

  const parts: PartLine[] = [];
  const seenParts = new Set<string>();
  draft.parts.forEach((d, i) => {
    const line = requested.parts.find((p) => p.lineId === d.lineId);
    if (!line) return fail(`parts.${i}.lineId`, `This claim has no part line "${d.lineId}".`);
    if (seenParts.has(d.lineId)) return fail(`parts.${i}.lineId`, `Part line "${d.lineId}" is answered twice.`);
    seenParts.add(d.lineId);
    const q = d.quantity;
    if (typeof q !== 'number' || !Number.isFinite(q)) return fail(`parts.${i}.quantity`, 'Enter a quantity (0 if the part is not approved).');
    if (q < 0) return fail(`parts.${i}.quantity`, 'A quantity cannot be negative.');
    if (!Number.isInteger(q)) return fail(`parts.${i}.quantity`, 'Whole parts only.');
    if (q > line.quantity) return fail(`parts.${i}.quantity`, `At most ${line.quantity}: the dealer asked for ${line.quantity}.`);
    if (q > 0) parts.push({ ...line, quantity: q });
  });
  for (const p of requested.parts) {
    if (!seenParts.has(p.lineId)) fail('parts', `Part line ${p.lineId} (${p.partNumber}) has no quantity; enter 0 if it is not approved.`);
  }

  const labor: LaborLine[] = [];
  const seenLabor = new Set<string>();
  draft.labor.forEach((d, i) => {
    const line = requested.labor.find((l) => l.lineId === d.lineId);
    if (!line) return fail(`labor.${i}.lineId`, `This claim has no labor line "${d.lineId}".`);
    if (seenLabor.has(d.lineId)) return fail(`labor.${i}.lineId`, `Labor line "${d.lineId}" is answered twice.`);
    seenLabor.add(d.lineId);
    const op = schedule.find((o) => o.id === d.operationId);
    // A retired operation stays acceptable on the line that asked for it, not as a replacement.
    if (!op || (!op.active && op.id !== line.operationId)) {
      return fail(`labor.${i}.operationId`, 'Not an operation in the brand’s labor schedule; choose one from the list.');
    }
    const text = String(d.hours ?? '').trim();
    if (/^-/.test(text)) return fail(`labor.${i}.hours`, 'Hours cannot be negative.');
    const h = hundredthsOf(text);
    if (h === null) return fail(`labor.${i}.hours`, 'Hours like 0.80, with at most two decimals (0 if not approved).');
    const max = hundredthsOf(op.standardHours) ?? 0;
    if (h > max) return fail(`labor.${i}.hours`, `At most ${hoursText(max)} h, the scheduled time for ${op.code}.`);
    if (h > 0) labor.push({ lineId: line.lineId, operationId: op.id, code: op.code, description: op.description, hours: hoursText(h) });
  });
  for (const l of requested.labor) {
    if (!seenLabor.has(l.lineId)) fail('labor', `Labor line ${l.lineId} (${l.code}) has no hours; enter 0 if it is not approved.`);
  }

  let freightMinor = 0;
  const freightText = draft.freight.trim();
  if (freightText !== '') {
    const parsed = parseAmount(freightText.replace(',', '.'), { currency });
    if (!parsed.ok) fail('freight', `Freight as an amount, like 18.50 (${parsed.message}).`);
    else if (parsed.value < 0) fail('freight', 'Freight cannot be negative.');
    else if (parsed.value > requested.freightMinor) {
      fail('freight', `At most ${toDecimalString(requested.freightMinor, currency)} ${currency}: what the dealer asked for.`);
    } else freightMinor = parsed.value;
  }

  if (Object.keys(errors).length) return { ok: false, message: 'Some lines of the approval need attention.', fieldErrors: errors };

  const approved: ClaimLines = { parts, labor, freightMinor };
  const comparison = compareLines(requested, approved);
  if (!comparison.some((c) => c.status !== 'not_approved')) {
    return { ok: false, message: 'Nothing is approved; deny the claim instead.', fieldErrors: { _form: ['Nothing is approved; deny the claim instead.'] } };
  }
  const lines = comparison.map((c): MachineLine => {
    const note = describeChange(c, currency);
    return {
      lineId: c.lineId,
      approved: c.status !== 'not_approved',
      ...(c.status === 'changed' ? { changed: true } : {}),
      ...(note ? { note } : {}),
    };
  });
  const extent = comparison.every((c) => c.status === 'as_requested') ? 'full' : 'partial';
  return { ok: true, extent, approved, lines, comparison };
}

/** The approval form's starting point: every line as requested. */
export function draftFromRequest(requested: ClaimLines, currency: CurrencyCode): ApprovalDraft {
  return {
    parts: requested.parts.map((p) => ({ lineId: p.lineId, quantity: p.quantity })),
    labor: requested.labor.map((l) => ({ lineId: l.lineId, operationId: l.operationId, hours: l.hours })),
    freight: requested.freightMinor > 0 ? toDecimalString(requested.freightMinor, currency) : '',
  };
}
