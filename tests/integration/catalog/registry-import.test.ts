import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { POST as confirmImport } from '@/app/api/registry/imports/route';
import { POST as previewImport } from '@/app/api/registry/imports/preview/route';
import { db } from '@/db/connection';
import { actAs } from '../../support/acting-user';

const tag = Date.now().toString(36).toUpperCase();
const serial = (n: number) => `RG${tag}-${n}`;
const HEADER = 'frame_serial,model_code,retail_sale_date,selling_dealer_account,component_serials';

function upload(url: string, csv: string | Buffer, fields: Record<string, string> = {}, name = 'registry.csv') {
  const form = new FormData();
  form.set('file', new File([typeof csv === 'string' ? csv : new Uint8Array(csv)], name, { type: 'text/csv' }));
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  return new Request(`http://localhost${url}`, { method: 'POST', body: form });
}
const ctx = { params: Promise.resolve({}) };
const preview = async (csv: string | Buffer, name?: string) => {
  const res = await previewImport(upload('/api/registry/imports/preview', csv, {}, name), ctx);
  return { status: res.status, body: await res.json() };
};
const confirm = async (csv: string | Buffer, seen: { sha256: string; readyKey: string }) => {
  const res = await confirmImport(upload('/api/registry/imports', csv, seen), ctx);
  return { status: res.status, body: await res.json() };
};

let torvane: string;
const unitCount = async () => Number((await db()('registered_units').count('id as n').first())!.n);
const importCount = async () => Number((await db()('registry_imports').count('id as n').first())!.n);
const registered = (s: string) => db()('registered_units').where({ brand_id: torvane }).whereRaw('upper(frame_serial) = upper(?)', [s]).first();

beforeAll(async () => {
  torvane = (await db()('organisations').where({ slug: 'torvane' }).first('id')).id;
});

/** Four good rows and one of each problem the preview must name. */
const mixedFile = () =>
  [
    HEADER,
    `${serial(1)},KST-T,2025-03-01,TV-DE-0791,drive_unit=DU85-${tag}-1;battery=BP625-${tag}-1`,
    `${serial(2)},kst-u,2025-03-02,,`,
    `${serial(3)},NOPE-9,2025-03-03,,`,
    `${serial(4)},KST-T,03/04/2025,,`,
    `${serial(5)},KST-T,2099-01-01,,`,
    `${serial(6)},KST-T,2025-03-06,,`,
    `${serial(6)},HRR-C,2025-03-06,,`,
    `KT25-004187,KST-T,2025-03-07,,`,
    `${serial(8)},KST-T,2025-03-08,,drive_unit:DU85`,
    `${serial(9)},HRR-C,2025-03-09,,display=DPC2-${tag}`,
    `${serial(10)},SWF-S,2025-03-10,,`,
  ].join('\n');

describe('registry import: preview, then confirm', () => {
  beforeEach(() => actAs('diego.alves@torvane.test'));

  it('the preview names each row’s problem and writes nothing', async () => {
    const [units, imports] = [await unitCount(), await importCount()];
    const { status, body } = await preview(mixedFile());
    expect(status).toBe(200);
    expect(body).toMatchObject({ fileName: 'registry.csv', total: 11, ready: 4, refused: 7, importedBefore: null });
    const byRow = Object.fromEntries(body.rows.map((r: { row: number; status: string; problems: { message: string }[] }) => [r.row, [r.status, r.problems.map((p) => p.message).join(' | ')]]));
    expect(byRow).toEqual({
      2: ['ready', ''],
      3: ['ready', ''],
      4: ['refused', '“NOPE-9” is not a model code in the catalog.'],
      5: ['refused', '“03/04/2025” is not a date written YYYY-MM-DD.'],
      6: ['refused', '2099-01-01 is in the future.'],
      7: ['refused', 'The same frame serial is also on row 8 of this file.'],
      8: ['refused', 'The same frame serial is also on row 7 of this file.'],
      9: ['refused', 'KT25-004187 is already registered.'],
      10: ['refused', 'The component list “drive_unit:DU85” is not category=serial.'],
      11: ['ready', ''],
      12: ['ready', ''],
    });
    expect([await unitCount(), await importCount()]).toEqual([units, imports]);
  });

  it('confirming imports exactly the ready rows in one go, and logs the import with the rows left out', async () => {
    const csv = mixedFile();
    const { body: seen } = await preview(csv);
    const units = await unitCount();
    const { status, body } = await confirm(csv, seen);
    expect(status).toBe(201);
    expect(body).toMatchObject({ added: 4, skipped: 7, message: '4 bikes registered; 7 rows left out.' });
    expect(await unitCount()).toBe(units + 4);
    const first = await registered(serial(1));
    const dealer = await db()('organisations').where({ slug: 'kettenblatt' }).first('id');
    expect(first).toMatchObject({ retail_sale_date: '2025-03-01', selling_dealer_id: dealer.id, component_serials: { drive_unit: `DU85-${tag}-1`, battery: `BP625-${tag}-1` } });
    for (const n of [3, 4, 5, 6, 8]) expect(await registered(serial(n))).toBeUndefined();
    const log = await db()('registry_imports').where({ id: body.importId }).first();
    expect(log).toMatchObject({ brand_id: torvane, file_name: 'registry.csv', rows_total: 11, rows_added: 4, rows_skipped: 7, file_sha256: seen.sha256 });
    expect(log.refused_rows).toHaveLength(7);
    expect(log.refused_rows[0]).toEqual({ row: 4, frameSerial: serial(3), problems: ['“NOPE-9” is not a model code in the catalog.'] });

    // The same confirmation again (a double click): refused, nothing imported twice.
    const again = await confirm(csv, seen);
    expect(again.status).toBe(409);
    expect(again.body.error).toMatch(/Nothing was imported.*imported by Diego Alves/);
    expect(again.body.preview).toMatchObject({ ready: 0, importedBefore: { added: 4 } });
    expect(await unitCount()).toBe(units + 4);

    // A fresh preview of the same file says it was imported already.
    expect((await preview(csv)).body.importedBefore).toMatchObject({ by: 'Diego Alves', added: 4 });
  });

  it('two confirmations at once: exactly one imports', async () => {
    const csv = `${HEADER}\n${serial(20)},KST-T,2025-04-01,,\n${serial(21)},KST-T,2025-04-02,,\n`;
    const { body: seen } = await preview(csv);
    const units = await unitCount();
    const results = await Promise.all([confirm(csv, seen), confirm(csv, seen)]);
    expect(results.map((r) => r.status).sort()).toEqual([201, 409]);
    expect(await unitCount()).toBe(units + 2);
  });

  it('a registry that changed since the preview gets a fresh preview and nothing is half-imported', async () => {
    const csv = `${HEADER}\n${serial(30)},KST-T,2025-05-01,,\n${serial(31)},KST-T,2025-05-02,,\n${serial(32)},KST-T,2025-05-03,,\n`;
    const { body: seen } = await preview(csv);
    expect(seen.ready).toBe(3);
    // Meanwhile one of the bikes gets registered another way (a different letter case, same bike).
    const model = await db()('bike_models').where({ brand_id: torvane, code: 'KST-T' }).first('id');
    await db()('registered_units').insert({ brand_id: torvane, frame_serial: serial(31).toLowerCase(), model_id: model.id, retail_sale_date: '2025-05-02' });
    const units = await unitCount();
    const r = await confirm(csv, seen);
    expect(r.status).toBe(409);
    expect(r.body.preview).toMatchObject({ ready: 2, refused: 1 });
    expect(await unitCount()).toBe(units);
    expect(await registered(serial(30))).toBeUndefined();
  });

  it('the database itself refuses the same serial in another letter case', async () => {
    const model = await db()('bike_models').where({ brand_id: torvane, code: 'KST-T' }).first('id');
    await expect(db()('registered_units').insert({ brand_id: torvane, frame_serial: serial(31).toUpperCase(), model_id: model.id, retail_sale_date: '2025-05-02' })).rejects.toThrow(/registered_units_serial_upper/);
  });

  it('a confirmation with another file than the one previewed is refused', async () => {
    const csv = `${HEADER}\n${serial(40)},KST-T,2025-05-01,,\n`;
    const { body: seen } = await preview(csv);
    const r = await confirm(`${csv}${serial(41)},KST-T,2025-05-01,,\n`, seen);
    expect(r).toMatchObject({ status: 422, body: { error: expect.stringMatching(/not the file you previewed/) } });
    expect(await registered(serial(41))).toBeUndefined();
  });

  it('refuses files that are not a registry CSV, saying what they are', async () => {
    const cases: [string | Buffer, string, RegExp][] = [
      ['', 'empty.csv', /empty/],
      [Buffer.from('PK\u0003\u0004 workbook bytes'), 'units.csv', /spreadsheet workbook/],
      [Buffer.from([0x66, 0x72, 0xff, 0xfe, 0x00, 0x61]), 'units.csv', /not a text file/],
      [Buffer.from([0x66, 0x72, 0xe9, 0x0a, 0x61]), 'units.csv', /not UTF-8/],
      ['frame_serial;model_code;retail_sale_date\nA;B;C\n', 'units.csv', /semicolons/],
      [`${HEADER},notes\n`, 'units.csv', /Unknown column “notes”/],
      [`${HEADER}\n${serial(50)},KST-T,2025-01-01,,\n`, 'units.pdf', /not a \.csv file/],
      ['x'.repeat(2 * 1024 * 1024 + 10), 'big.csv', /at most 2 MB/],
    ];
    const units = await unitCount();
    for (const [body, name, message] of cases) {
      const r = await preview(body, name);
      expect(r.status, name).toBe(422);
      expect(r.body.error).toMatch(message);
    }
    const noFile = await previewImport(new Request('http://localhost/api/registry/imports/preview', { method: 'POST', body: new FormData() }), ctx);
    expect(noFile.status).toBe(422);
    expect(await unitCount()).toBe(units);
  });

  it('another brand’s admin sees this brand’s serials as unregistered and its model codes as unknown', async () => {
    await actAs('noah.quinn@wrenfield.test');
    const { body } = await preview(`${HEADER}\nKT25-004187,KST-T,2025-01-01,TV-DE-0791,\n`);
    expect(body.rows[0].problems.map((p: { column: string }) => p.column)).toEqual(['model_code', 'selling_dealer_account']);
  });

  it('only a brand admin may preview or import', async () => {
    for (const email of ['priya.nair@torvane.test', 'felix.moreau@torvane.test', 'lena.hartmann@kettenblatt.test']) {
      await actAs(email);
      expect((await preview(mixedFile())).status).toBe(403);
      expect((await confirm(mixedFile(), { sha256: 'a'.repeat(64), readyKey: 'b'.repeat(64) })).status).toBe(403);
    }
    await actAs(null);
    expect((await preview(mixedFile())).status).toBe(401);
  });
});
