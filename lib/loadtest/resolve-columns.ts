import { columnRef, type LoadtestIssue } from './issues';
import {
  guessColumn,
  headerSignature,
  normalizeHeader,
  QUANTITY_UNITS,
  recognizeColumn,
  type ColumnGuess,
  type ColumnMapping,
  type ColumnQuantity,
  type ColumnRole,
} from './columns';

/** What one kind of load test needs from a file. */
export interface ImportSpec {
  readonly kind: 'dyno' | 'battery';
  /** Every one of these must be present. */
  readonly required: readonly ColumnQuantity[];
  /** At least one of these must be present. */
  readonly atLeastOne: readonly ColumnQuantity[];
}

export const QUANTITY_NAMES: Readonly<Record<ColumnQuantity, string>> = {
  time: 'time',
  speed: 'speed',
  wheelPower: 'wheel power',
  wheelTorque: 'wheel torque',
  voltage: 'voltage',
  current: 'current',
};

export interface ResolvedColumn {
  /** 0-based position in the row. */
  readonly index: number;
  readonly header: string;
  readonly role: Exclude<ColumnRole, { quantity: 'ignore' }>;
}

export interface NeedsMapping {
  readonly status: 'needs-mapping';
  readonly headers: readonly string[];
  readonly signature: string;
  readonly guesses: readonly ColumnGuess[];
  /** Required quantities no recognised column supplies yet. */
  readonly missing: readonly ColumnQuantity[];
  /** When none of "at least one of these" is supplied yet (dyno: wheel torque or wheel power), the list; else empty. */
  readonly missingOneOf: readonly ColumnQuantity[];
  /** A starting mapping from the guesses that name a unit; other columns are set to ignore. */
  readonly proposedMapping: ColumnMapping;
}

export type ResolveResult =
  | { readonly status: 'ok'; readonly columns: readonly ResolvedColumn[]; readonly warnings: readonly LoadtestIssue[] }
  | NeedsMapping
  | { readonly status: 'error'; readonly errors: readonly LoadtestIssue[] };

function validRole(role: unknown): role is ColumnRole {
  if (typeof role !== 'object' || role === null) return false;
  const { quantity, unit } = role as { quantity?: unknown; unit?: unknown };
  if (quantity === 'ignore') return true;
  if (typeof quantity !== 'string' || !Object.prototype.hasOwnProperty.call(QUANTITY_UNITS, quantity)) return false;
  return (QUANTITY_UNITS[quantity as ColumnQuantity] as readonly string[]).includes(String(unit));
}

function describeRoleChoices(): string {
  return (Object.keys(QUANTITY_UNITS) as ColumnQuantity[]).map((q) => `${q} (${QUANTITY_UNITS[q].join(', ')})`).join('; ');
}

/**
 * Decide which column holds what. Our own column names are taken at once; any other header needs
 * a mapping from the dealer, unless `mapping` supplies one (then unmapped unknown columns are ignored
 * with a warning). Empty headers, as left by a trailing delimiter, are ignored.
 */
export function resolveColumns(headers: readonly string[], spec: ImportSpec, mapping?: ColumnMapping | null): ResolveResult {
  const errors: LoadtestIssue[] = [];
  const warnings: LoadtestIssue[] = [];
  const seen = new Map<string, number>();
  headers.forEach((h, i) => {
    const key = normalizeHeader(h);
    if (key === '') return;
    const first = seen.get(key);
    if (first !== undefined) {
      errors.push({
        code: 'duplicate-header',
        column: h,
        columnNumber: i + 1,
        message: `Columns ${first + 1} and ${i + 1} are both named "${h.trim()}"; rename one so each column has its own name.`,
      });
    } else seen.set(key, i);
  });
  if (errors.length) return { status: 'error', errors };

  const mapped = new Map<number, ColumnRole>();
  if (mapping) {
    for (const [key, role] of Object.entries(mapping)) {
      const index = seen.get(normalizeHeader(key));
      if (index === undefined) {
        errors.push({ code: 'mapping-unknown-column', column: key, message: `The mapping names a column "${key}" that is not in this file.` });
      } else if (!validRole(role)) {
        errors.push({
          code: 'mapping-invalid',
          column: key,
          columnNumber: index + 1,
          message: `The mapping for ${columnRef(key, index + 1)} is not a known quantity and unit. Choose one of: ${describeRoleChoices()}; or ignore.`,
        });
      } else mapped.set(index, role);
    }
    if (errors.length) return { status: 'error', errors };
  }

  const wanted = new Set<ColumnQuantity>([...spec.required, ...spec.atLeastOne]);
  const columns: ResolvedColumn[] = [];
  const unknown: number[] = [];
  const byQuantity = new Map<ColumnQuantity, number>();
  headers.forEach((header, index) => {
    if (normalizeHeader(header) === '') return;
    const role = mapped.get(index) ?? recognizeColumn(header);
    if (role === null) {
      unknown.push(index);
      return;
    }
    if (role.quantity === 'ignore') return;
    if (!wanted.has(role.quantity)) {
      warnings.push({
        code: 'column-ignored',
        column: header,
        columnNumber: index + 1,
        message: `${columnRef(header, index + 1)} holds ${QUANTITY_NAMES[role.quantity]}, which a ${spec.kind === 'dyno' ? 'dyno run' : 'battery test'} does not use; it was left out.`,
      });
      return;
    }
    const other = byQuantity.get(role.quantity);
    if (other !== undefined) {
      errors.push({
        code: 'duplicate-quantity',
        column: header,
        columnNumber: index + 1,
        message: `${columnRef(headers[other] ?? '', other + 1)} and ${columnRef(header, index + 1)} both hold ${QUANTITY_NAMES[role.quantity]}; keep one and set the other to ignore.`,
      });
      return;
    }
    byQuantity.set(role.quantity, index);
    columns.push({ index, header, role });
  });
  if (errors.length) return { status: 'error', errors };

  const missing = spec.required.filter((q) => !byQuantity.has(q));
  const noneOf = spec.atLeastOne.length > 0 && !spec.atLeastOne.some((q) => byQuantity.has(q));

  if (unknown.length > 0 && !mapping) {
    const guesses = headers.flatMap((h, i) => (normalizeHeader(h) === '' ? [] : [guessColumn(h, i + 1)]));
    const proposed: Record<string, ColumnRole> = {};
    const taken = new Set<ColumnQuantity>();
    for (const g of guesses) {
      const ok = g.guess && g.guess.unit !== null && wanted.has(g.guess.quantity) && !taken.has(g.guess.quantity);
      if (ok && g.guess && g.guess.unit !== null) {
        const role = { quantity: g.guess.quantity, unit: g.guess.unit };
        if (validRole(role)) {
          proposed[g.header] = role;
          taken.add(g.guess.quantity);
          continue;
        }
      }
      proposed[g.header] = { quantity: 'ignore' };
    }
    return {
      status: 'needs-mapping',
      headers,
      signature: headerSignature(headers),
      guesses,
      missing,
      missingOneOf: noneOf ? spec.atLeastOne : [],
      proposedMapping: proposed,
    };
  }
  for (const index of unknown) {
    const header = headers[index] ?? '';
    warnings.push({ code: 'column-ignored', column: header, columnNumber: index + 1, message: `${columnRef(header, index + 1)} is not in the mapping; it was left out.` });
  }

  for (const q of missing) {
    errors.push({ code: 'missing-column', message: `The file has no ${QUANTITY_NAMES[q]} column. ${columnHint(q)}` });
  }
  if (noneOf) {
    errors.push({
      code: 'missing-column',
      message: `The file has no ${spec.atLeastOne.map((q) => QUANTITY_NAMES[q]).join(' or ')} column; a run needs at least one. ${spec.atLeastOne.map(columnHint).join(' ')}`,
    });
  }
  if (errors.length) return { status: 'error', errors };
  return { status: 'ok', columns, warnings };
}

function columnHint(q: ColumnQuantity): string {
  const prefix = { time: 'time', speed: 'speed', wheelPower: 'wheel_power', wheelTorque: 'wheel_torque', voltage: 'voltage', current: 'current' }[q];
  return `Name it ${QUANTITY_UNITS[q].map((u) => `${prefix}_${u}`).join(', ')}, or map it.`;
}
