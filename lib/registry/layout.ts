import { PART_CATEGORIES } from '@/lib/coverage';

/**
 * The registry file layout: comma-separated, UTF-8, a header row first, one sold bike a row.
 * The names are ours; the same table is printed on the import screen.
 */
export const REGISTRY_COLUMNS = [
  { name: 'frame_serial', required: true, example: 'KT26-001250', description: 'The serial stamped on the frame, 3–40 letters, digits, - _ / .' },
  { name: 'model_code', required: true, example: 'KST-T', description: 'The code of one of the brand’s bike models (as in the catalog).' },
  { name: 'retail_sale_date', required: true, example: '2025-04-12', description: 'The day the bike was sold to the rider, as YYYY-MM-DD; not in the future.' },
  { name: 'selling_dealer_account', required: false, example: 'TV-DE-0791', description: 'Optional: the selling shop’s account number with the brand.' },
  {
    name: 'component_serials',
    required: false,
    example: 'drive_unit=DU85-2503-11872;battery=BP625-2504-07731',
    description: `Optional: category=serial pairs separated by “;”, each category once. Categories: ${PART_CATEGORIES.join(', ')}.`,
  },
] as const;

export type RegistryColumn = (typeof REGISTRY_COLUMNS)[number]['name'];

/** Limits of one import, stated on the screen. */
export const REGISTRY_LIMITS = { maxBytes: 2 * 1024 * 1024, maxRows: 10_000 } as const;

/** Sale dates before this are taken for a typing error in the year. */
export const EARLIEST_SALE_DATE = '2000-01-01';

export const SERIAL_PATTERN = /^[A-Za-z0-9][A-Za-z0-9\-_/.]*$/;
export const FRAME_SERIAL_LENGTH = { min: 3, max: 40 } as const;
export const COMPONENT_SERIAL_MAX = 60;

export function sampleRegistryCsv(): string {
  const header = REGISTRY_COLUMNS.map((c) => c.name).join(',');
  const row = REGISTRY_COLUMNS.map((c) => c.example).join(',');
  return `${header}\n${row}\n`;
}
