import { isIsoDate, type IsoDate } from '@/lib/calendar';
import type { PartCategory } from '@/lib/coverage';
import { parseComponentList } from './components';
import { EARLIEST_SALE_DATE, FRAME_SERIAL_LENGTH, SERIAL_PATTERN, type RegistryColumn } from './layout';
import type { RawRegistryRow } from './parse-csv';

/** What the brand's own data says about the file's values (looked up by the caller). */
export interface RegistryCheckContext {
  /** Model codes of the brand, upper-cased → model id. */
  modelsByCode: ReadonlyMap<string, string>;
  /** Dealer account numbers with the brand, upper-cased → dealer organisation id. */
  dealersByAccount: ReadonlyMap<string, string>;
  /** Frame serials already registered with the brand, upper-cased. */
  registeredSerials: ReadonlySet<string>;
  /** The brand's today: a sale date after it is in the future. */
  today: IsoDate;
}

export type RegistryProblem = { column: RegistryColumn | 'row'; message: string };

export type RegistryUnitInput = {
  frameSerial: string;
  modelId: string;
  retailSaleDate: IsoDate;
  sellingDealerId: string | null;
  componentSerials: Partial<Record<PartCategory, string>>;
};

export type CheckedRegistryRow = {
  row: number;
  fields: RawRegistryRow['fields'];
  status: 'ready' | 'refused';
  problems: RegistryProblem[];
  unit?: RegistryUnitInput;
};

export type RegistryCheck = { rows: CheckedRegistryRow[]; ready: number; refused: number };

const key = (serial: string) => serial.trim().toUpperCase();

/**
 * Checks every row of a registry file against the layout and the brand's data, and says for
 * each whether it can be imported and, if not, every reason. A frame serial that appears on
 * more than one row refuses all of them: the file cannot say which row is right.
 */
export function checkRegistryRows(rows: readonly RawRegistryRow[], ctx: RegistryCheckContext): RegistryCheck {
  const linesOf = new Map<string, number[]>();
  for (const r of rows) {
    const s = r.fields.frame_serial ?? '';
    if (s !== '') linesOf.set(key(s), [...(linesOf.get(key(s)) ?? []), r.row]);
  }

  const checked = rows.map((r): CheckedRegistryRow => {
    const problems: RegistryProblem[] = [];
    const f = r.fields;
    if (r.readProblem) problems.push({ column: 'row', message: `Row ${r.readProblem}.` });

    const serial = f.frame_serial ?? '';
    if (serial === '') problems.push({ column: 'frame_serial', message: 'The frame serial is empty.' });
    else if (serial.length < FRAME_SERIAL_LENGTH.min || serial.length > FRAME_SERIAL_LENGTH.max) {
      problems.push({ column: 'frame_serial', message: `A frame serial has ${FRAME_SERIAL_LENGTH.min}–${FRAME_SERIAL_LENGTH.max} characters; “${serial}” has ${serial.length}.` });
    } else if (!SERIAL_PATTERN.test(serial)) {
      problems.push({ column: 'frame_serial', message: `“${serial}” has characters a frame serial cannot have (letters, digits, - _ / . only).` });
    } else {
      const others = (linesOf.get(key(serial)) ?? []).filter((n) => n !== r.row);
      if (others.length) problems.push({ column: 'frame_serial', message: `The same frame serial is also on row ${others.join(', ')} of this file.` });
      if (ctx.registeredSerials.has(key(serial))) problems.push({ column: 'frame_serial', message: `${serial} is already registered.` });
    }

    const code = f.model_code ?? '';
    const modelId = code === '' ? undefined : ctx.modelsByCode.get(code.toUpperCase());
    if (code === '') problems.push({ column: 'model_code', message: 'The model code is empty.' });
    else if (!modelId) problems.push({ column: 'model_code', message: `“${code}” is not a model code in the catalog.` });

    const date = f.retail_sale_date ?? '';
    if (date === '') problems.push({ column: 'retail_sale_date', message: 'The retail sale date is empty.' });
    else if (!isIsoDate(date)) problems.push({ column: 'retail_sale_date', message: `“${date}” is not a date written YYYY-MM-DD.` });
    else if (date > ctx.today) problems.push({ column: 'retail_sale_date', message: `${date} is in the future.` });
    else if (date < EARLIEST_SALE_DATE) problems.push({ column: 'retail_sale_date', message: `${date} is before ${EARLIEST_SALE_DATE.slice(0, 4)}; check the year.` });

    const account = f.selling_dealer_account ?? '';
    const dealerId = account === '' ? null : (ctx.dealersByAccount.get(account.toUpperCase()) ?? undefined);
    if (dealerId === undefined) problems.push({ column: 'selling_dealer_account', message: `“${account}” is not the account number of one of the brand’s dealers.` });

    const components = parseComponentList(f.component_serials ?? '');
    if (!components.ok) problems.push({ column: 'component_serials', message: `The component list ${components.message}.` });

    if (problems.length || !modelId || dealerId === undefined || !components.ok) return { row: r.row, fields: f, status: 'refused', problems };
    return {
      row: r.row,
      fields: f,
      status: 'ready',
      problems,
      unit: { frameSerial: serial, modelId, retailSaleDate: date, sellingDealerId: dealerId, componentSerials: components.value },
    };
  });
  const ready = checked.filter((c) => c.status === 'ready').length;
  return { rows: checked, ready, refused: checked.length - ready };
}
