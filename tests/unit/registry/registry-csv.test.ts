import { describe, expect, it } from 'vitest';
import { checkRegistryRows, formatComponentList, parseComponentList, parseRegistryCsv, REGISTRY_LIMITS, sampleRegistryCsv, type RegistryCheckContext } from '@/lib/registry';

const HEADER = 'frame_serial,model_code,retail_sale_date,selling_dealer_account,component_serials';

const ctx = (over: Partial<RegistryCheckContext> = {}): RegistryCheckContext => ({
  modelsByCode: new Map([['KST-T', 'model-1'], ['HRR-C', 'model-2']]),
  dealersByAccount: new Map([['TV-DE-0791', 'dealer-1']]),
  registeredSerials: new Set(['KT25-004187']),
  today: '2026-06-15',
  ...over,
});

function check(csv: string, over?: Partial<RegistryCheckContext>) {
  const parsed = parseRegistryCsv(csv);
  if (!parsed.ok) throw new Error(parsed.message);
  return checkRegistryRows(parsed.rows, ctx(over));
}

const messages = (r: { problems: { message: string }[] }) => r.problems.map((p) => p.message).join(' | ');

describe('reading the file', () => {
  it('reads the layout, with a byte-order mark, CRLF line ends, columns in another order and blank lines', () => {
    const csv = '\uFEFFModel Code,Frame-Serial,retail_sale_date\r\nKST-T,AB-1001,2025-04-12\r\n\r\nhrr-c,ab-1002,2025-05-01\r\n';
    const r = parseRegistryCsv(csv);
    expect(r).toEqual({
      ok: true,
      rows: [
        { row: 2, fields: { model_code: 'KST-T', frame_serial: 'AB-1001', retail_sale_date: '2025-04-12' } },
        { row: 4, fields: { model_code: 'hrr-c', frame_serial: 'ab-1002', retail_sale_date: '2025-05-01' } },
      ],
    });
  });

  it('takes quoted fields with commas and doubled quotes (RFC 4180 §2, rules 6 and 7)', () => {
    const r = parseRegistryCsv(`${HEADER}\n"AB-1,2",KST-T,2025-04-12,,"drive_unit=X""1"\n`);
    expect(r.ok && r.rows[0]!.fields).toMatchObject({ frame_serial: 'AB-1,2', component_serials: 'drive_unit=X"1' });
  });

  it('refuses a file that is empty, has no data rows, or is separated by semicolons or tabs', () => {
    expect(parseRegistryCsv('')).toEqual({ ok: false, message: 'The file is empty.' });
    expect(parseRegistryCsv(' \n\n')).toMatchObject({ ok: false, message: 'The file is empty.' });
    expect(parseRegistryCsv(`${HEADER}\n\n`)).toMatchObject({ ok: false, message: expect.stringMatching(/no bikes below/) });
    expect(parseRegistryCsv('frame_serial;model_code;retail_sale_date\nA;B;2025-01-01')).toMatchObject({ ok: false, message: expect.stringMatching(/semicolons/) });
    expect(parseRegistryCsv('frame_serial\tmodel_code\tretail_sale_date\nA\tB\t2025-01-01')).toMatchObject({ ok: false, message: expect.stringMatching(/tabs/) });
  });

  it('refuses unknown, missing and repeated columns, naming them', () => {
    expect(parseRegistryCsv('frame_serial,model_code,retail_sale_date,notes\nA,B,C,D')).toMatchObject({ ok: false, message: expect.stringMatching(/Unknown column “notes”/) });
    expect(parseRegistryCsv('frame_serial,retail_sale_date\nA,2025-01-01')).toMatchObject({ ok: false, message: expect.stringMatching(/lacks model_code/) });
    expect(parseRegistryCsv('frame_serial,model_code,model_code,retail_sale_date\nA,B,B,C')).toMatchObject({ ok: false, message: expect.stringMatching(/“model_code” appears twice/) });
    expect(parseRegistryCsv('KT25-1,KST-T,2025-01-01\n')).toMatchObject({ ok: false, message: expect.stringMatching(/Unknown columns/) });
  });

  it('keeps a row with too many or too few fields as a row problem, with its spreadsheet row number', () => {
    const r = parseRegistryCsv(`${HEADER}\nA-100,KST-T,2025-01-01,,drive_unit=1,extra\nA-101,KST-T\nA-102,KST-T,2025-01-01,,\n`);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.rows.map((x) => [x.row, x.readProblem])).toEqual([
      [2, expect.stringMatching(/more fields/)],
      [3, expect.stringMatching(/fewer fields/)],
      [4, undefined],
    ]);
  });

  it('refuses more rows than one import takes', () => {
    const rows = Array.from({ length: REGISTRY_LIMITS.maxRows + 1 }, (_, i) => `S-${i},KST-T,2025-01-01`);
    expect(parseRegistryCsv(`frame_serial,model_code,retail_sale_date\n${rows.join('\n')}`)).toMatchObject({ ok: false, message: expect.stringMatching(/at most 10000/) });
  });

  it('the sample on the import screen is itself a valid file', () => {
    const r = check(sampleRegistryCsv(), { registeredSerials: new Set() });
    expect(r).toMatchObject({ ready: 1, refused: 0 });
  });
});

describe('component lists', () => {
  it('reads category=serial pairs, ignoring spaces and one trailing “;”', () => {
    expect(parseComponentList(' drive_unit = DU85-1 ; Battery=BP625-2; ')).toEqual({ ok: true, value: { drive_unit: 'DU85-1', battery: 'BP625-2' } });
    expect(parseComponentList('')).toEqual({ ok: true, value: {} });
    expect(formatComponentList({ drive_unit: 'DU85-1', battery: 'BP625-2' })).toBe('drive_unit=DU85-1;battery=BP625-2');
  });

  it.each([
    ['drive_unit:DU85-1', /is not category=serial/],
    ['motor=DU85-1', /“motor” is not a part category/],
    ['drive_unit=', /drive_unit has no serial/],
    ['=DU85-1', /no category before/],
    ['drive_unit=A;;battery=B', /empty entry/],
    ['battery=A;battery=B', /names battery twice/],
    ['battery=A B', /characters a serial cannot have/],
    [`battery=${'X'.repeat(61)}`, /longer than 60/],
  ])('refuses %s', (text, message) => {
    const r = parseComponentList(text);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message).toMatch(message);
  });
});

describe('checking rows against the brand', () => {
  it('a good row becomes a unit with ids from the catalog; model codes and accounts match without regard to case', () => {
    const r = check(`${HEADER}\nKT26-000900,kst-t,2026-06-15,tv-de-0791,drive_unit=DU85-9;battery=BP625-9\n`);
    expect(r).toMatchObject({ ready: 1, refused: 0 });
    expect(r.rows[0]).toMatchObject({
      status: 'ready',
      problems: [],
      unit: { frameSerial: 'KT26-000900', modelId: 'model-1', retailSaleDate: '2026-06-15', sellingDealerId: 'dealer-1', componentSerials: { drive_unit: 'DU85-9', battery: 'BP625-9' } },
    });
  });

  it('without a dealer account the unit has no selling dealer', () => {
    const r = check('frame_serial,model_code,retail_sale_date\nKT26-000901,KST-T,2026-01-02\n');
    expect(r.rows[0]!.unit).toMatchObject({ sellingDealerId: null, componentSerials: {} });
  });

  it('names each problem of a bad row, and collects them all', () => {
    const r = check(`${HEADER}\n,NOPE,12/04/2025,XX-1,motor=1\n`);
    expect(r).toMatchObject({ ready: 0, refused: 1 });
    expect(r.rows[0]!.problems.map((p) => p.column)).toEqual(['frame_serial', 'model_code', 'retail_sale_date', 'selling_dealer_account', 'component_serials']);
    expect(messages(r.rows[0]!)).toMatch(/frame serial is empty.*“NOPE” is not a model code.*“12\/04\/2025” is not a date written YYYY-MM-DD.*“XX-1” is not the account number.*“motor” is not a part category/);
    expect(r.rows[0]!.unit).toBeUndefined();
  });

  it('calendar days: 2024-02-29 exists, 2025-02-29 and 2025-04-31 do not (Gregorian leap-year rule, ISO 8601 calendar dates)', () => {
    const r = check(`frame_serial,model_code,retail_sale_date\nL-2024,KST-T,2024-02-29\nL-2025,KST-T,2025-02-29\nL-0431,KST-T,2025-04-31\n`);
    expect(r.rows.map((x) => x.status)).toEqual(['ready', 'refused', 'refused']);
  });

  it('a sale date after the brand’s today is in the future; today itself is fine; a year before 2000 is a typing error', () => {
    const r = check(`frame_serial,model_code,retail_sale_date\nF-1,KST-T,2026-06-16\nF-2,KST-T,2026-06-15\nF-3,KST-T,1925-06-15\n`);
    expect(r.rows.map((x) => x.status)).toEqual(['refused', 'ready', 'refused']);
    expect(messages(r.rows[0]!)).toMatch(/2026-06-16 is in the future/);
    expect(messages(r.rows[2]!)).toMatch(/before 2000/);
  });

  it('a serial twice in the file refuses every row that has it, naming the others (case ignored)', () => {
    const r = check(`frame_serial,model_code,retail_sale_date\nD-1,KST-T,2025-01-01\nD-2,KST-T,2025-01-01\nd-1,KST-T,2025-01-02\nD-1,KST-T,2025-01-03\n`);
    expect(r.rows.map((x) => x.status)).toEqual(['refused', 'ready', 'refused', 'refused']);
    expect(messages(r.rows[0]!)).toBe('The same frame serial is also on row 4, 5 of this file.');
    expect(messages(r.rows[2]!)).toBe('The same frame serial is also on row 2, 5 of this file.');
  });

  it('a serial already registered with the brand is refused (case ignored)', () => {
    const r = check(`frame_serial,model_code,retail_sale_date\nkt25-004187,KST-T,2025-01-01\n`);
    expect(messages(r.rows[0]!)).toBe('kt25-004187 is already registered.');
  });

  it('a malformed serial and a row with a field too many are refused', () => {
    const r = check(`frame_serial,model_code,retail_sale_date\nAB,KST-T,2025-01-01\nA B C,KST-T,2025-01-01\nOK-1,KST-T,2025-01-01,extra\n`);
    expect(r.rows.map((x) => x.status)).toEqual(['refused', 'refused', 'refused']);
    expect(messages(r.rows[0]!)).toMatch(/3–40 characters; “AB” has 2/);
    expect(messages(r.rows[1]!)).toMatch(/characters a frame serial cannot have/);
    expect(messages(r.rows[2]!)).toMatch(/Row has more fields than the header/);
  });
});
