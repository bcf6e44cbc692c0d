import { PART_CATEGORIES, type PartCategory } from '@/lib/coverage';
import { COMPONENT_SERIAL_MAX, SERIAL_PATTERN } from './layout';

export type ComponentListResult = { ok: true; value: Partial<Record<PartCategory, string>> } | { ok: false; message: string };

/**
 * Reads `category=serial;category=serial`. Spaces around names and serials are ignored, and
 * so is one trailing “;”. Each category may appear once; an unknown category or a pair
 * without “=” is refused with the pair named.
 */
export function parseComponentList(text: string): ComponentListResult {
  const value: Partial<Record<PartCategory, string>> = {};
  const trimmed = text.trim();
  if (trimmed === '') return { ok: true, value };
  const pairs = trimmed.replace(/;\s*$/, '').split(';');
  for (const raw of pairs) {
    const pair = raw.trim();
    if (pair === '') return { ok: false, message: 'has an empty entry between two “;”' };
    const eq = pair.indexOf('=');
    if (eq < 0) return { ok: false, message: `“${pair}” is not category=serial` };
    const category = pair.slice(0, eq).trim().toLowerCase();
    const serial = pair.slice(eq + 1).trim();
    if (category === '') return { ok: false, message: `“${pair}” has no category before “=”` };
    if (!(PART_CATEGORIES as readonly string[]).includes(category)) {
      return { ok: false, message: `“${category}” is not a part category (use ${PART_CATEGORIES.join(', ')})` };
    }
    if (serial === '') return { ok: false, message: `${category} has no serial after “=”` };
    if (serial.length > COMPONENT_SERIAL_MAX) return { ok: false, message: `the ${category} serial is longer than ${COMPONENT_SERIAL_MAX} characters` };
    if (!SERIAL_PATTERN.test(serial)) return { ok: false, message: `the ${category} serial “${serial}” has characters a serial cannot have` };
    if (value[category as PartCategory] !== undefined) return { ok: false, message: `names ${category} twice` };
    value[category as PartCategory] = serial;
  }
  return { ok: true, value };
}

/** The stored form back to the layout's text, for display and export. */
export function formatComponentList(components: Record<string, string>): string {
  return Object.entries(components)
    .map(([k, v]) => `${k}=${v}`)
    .join(';');
}
