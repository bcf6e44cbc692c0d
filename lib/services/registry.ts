import 'server-only';
import { createHash } from 'node:crypto';
import { db } from '@/db/connection';
import { localDate } from '@/lib/calendar';
import { brandSettings, findImportOfFile, insertRegisteredUnits, insertRegistryImport, modelsByCode, registeredSerialsAmong } from '@/lib/db/catalog';
import { dealersByAccountNumber } from '@/lib/db/dealer-accounts';
import type { AppUser } from '@/lib/db/users';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import { checkRegistryRows, parseRegistryCsv, REGISTRY_LIMITS, type CheckedRegistryRow } from '@/lib/registry';

export type RegistryFile = { name: string; bytes: Buffer };

export type RegistryPreview = {
  fileName: string;
  sha256: string;
  /** Fingerprint of exactly which rows are ready; the confirmation must match it. */
  readyKey: string;
  total: number;
  ready: number;
  refused: number;
  rows: CheckedRegistryRow[];
  /** When the same file was imported before, who did it and when. */
  importedBefore: { at: string; by: string; added: number } | null;
};

export type RegistryImportResult = { importId: number; added: number; skipped: number; message: string };

const sha256 = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');

function adminBrandId(user: AppUser): string {
  if (user.role !== 'brand_admin' || user.orgKind !== 'brand') throw new ForbiddenError('Only the brand admin imports the registry.');
  return user.organisationId;
}

const refuseFile = (message: string): never => {
  throw new ValidationError(message, { file: [message] });
};

/** The file's text, or a refusal that says what the file is instead. */
function textOf(file: RegistryFile): string {
  if (file.bytes.length === 0) refuseFile(`${file.name} is empty.`);
  if (file.bytes.length > REGISTRY_LIMITS.maxBytes) refuseFile(`${file.name} is ${(file.bytes.length / 1024 / 1024).toFixed(1)} MB; one import takes at most ${REGISTRY_LIMITS.maxBytes / 1024 / 1024} MB. Split it into smaller files.`);
  if (!/\.(csv|txt)$/i.test(file.name)) refuseFile(`${file.name} is not a .csv file. Save the list as CSV (comma-separated, UTF-8).`);
  const head = file.bytes.subarray(0, 8);
  if (head[0] === 0x50 && head[1] === 0x4b) refuseFile(`${file.name} is a spreadsheet workbook, not CSV. Save it as “CSV UTF-8 (comma-separated)” and upload that.`);
  if (file.bytes.includes(0)) refuseFile(`${file.name} is not a text file.`);
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(file.bytes);
  } catch {
    return refuseFile(`${file.name} is not UTF-8 text. Save it as “CSV UTF-8”.`);
  }
}

async function check(brandId: string, file: RegistryFile, q = db()): Promise<RegistryPreview> {
  const brand = await brandSettings(brandId, q);
  if (!brand) throw new NotFoundError('No such brand.');
  const parsed = parseRegistryCsv(textOf(file));
  if (!parsed.ok) refuseFile(parsed.message);
  const rows = parsed.ok ? parsed.rows : [];
  // One after another: inside the import's transaction these share one connection.
  const models = await modelsByCode(brandId, q);
  const dealers = await dealersByAccountNumber(brandId, q);
  const registered = await registeredSerialsAmong(brandId, rows.map((r) => r.fields.frame_serial ?? ''), q);
  const result = checkRegistryRows(rows, {
    modelsByCode: models, dealersByAccount: dealers, registeredSerials: registered, today: localDate(new Date().toISOString(), brand.timeZone),
  });
  const fileSha = sha256(file.bytes);
  const before = await findImportOfFile(brandId, fileSha, q);
  return {
    fileName: file.name,
    sha256: fileSha,
    readyKey: sha256(result.rows.filter((r) => r.status === 'ready').map((r) => r.row).join(',')),
    total: result.rows.length,
    ready: result.ready,
    refused: result.refused,
    rows: result.rows,
    importedBefore: before ? { at: new Date(before.createdAt).toISOString(), by: before.importedByName, added: before.rowsAdded } : null,
  };
}

/** Reads and checks the file; writes nothing. */
export async function previewRegistryImport(user: AppUser, file: RegistryFile): Promise<RegistryPreview> {
  return check(adminBrandId(user), file);
}

/**
 * Imports the ready rows of a previewed file in one transaction, or nothing. The file must be
 * the one previewed and its ready rows the ones shown; if the registry changed in between (or
 * the same confirmation arrives twice) the admin gets a fresh preview instead of a surprise.
 */
export async function confirmRegistryImport(user: AppUser, file: RegistryFile, seen: { sha256: string; readyKey: string }): Promise<RegistryImportResult> {
  const brandId = adminBrandId(user);
  if (sha256(file.bytes) !== seen.sha256) refuseFile('This is not the file you previewed; upload it again to see its preview.');
  return db().transaction(async (trx) => {
    // One import per brand at a time, so two confirmations cannot both pass the checks.
    await trx.raw('SELECT pg_advisory_xact_lock(hashtext(?))', [`registry-import:${brandId}`]);
    const now = await check(brandId, file, trx);
    if (now.readyKey !== seen.readyKey) {
      const why = now.ready === 0 && now.importedBefore ? ` This file was imported by ${now.importedBefore.by}; its bikes are registered already.` : ' Check the new preview.';
      throw new ConflictError(`Nothing was imported: the registry changed since the preview.${why}`, { preview: now });
    }
    if (now.ready === 0) refuseFile('No row of this file can be imported; fix the rows shown and upload the file again.');
    const units = now.rows.flatMap((r) => (r.unit ? [r.unit] : []));
    const added = await insertRegisteredUnits(trx, brandId, units).catch((err: { code?: string }) => {
      if (err.code === '23505') throw new ConflictError('Nothing was imported: a bike of this file was registered at the same moment. Upload the file again.');
      throw err;
    });
    const refusedRows = now.rows
      .filter((r) => r.status === 'refused')
      .map((r) => ({ row: r.row, frameSerial: r.fields.frame_serial ?? '', problems: r.problems.map((p) => p.message) }));
    const importId = await insertRegistryImport(trx, { brandId, importedBy: user.id, fileName: file.name, fileSha256: now.sha256, rowsTotal: now.total, rowsAdded: added, refusedRows });
    return {
      importId,
      added,
      skipped: refusedRows.length,
      message: `${added} bike${added === 1 ? '' : 's'} registered${refusedRows.length ? `; ${refusedRows.length} row${refusedRows.length === 1 ? '' : 's'} left out` : ''}.`,
    };
  });
}
