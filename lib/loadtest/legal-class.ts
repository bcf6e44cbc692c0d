import { formatQuantity, fromSi, toSi, type SpeedUnit } from '@/lib/units';

export type LegalClassId = 'eu-pedelec' | 'us-class-1' | 'us-class-2' | 'us-class-3';

export interface LegalClass {
  readonly id: LegalClassId;
  readonly name: string;
  /** Speed at which motor assistance must have stopped, in `unit`. */
  readonly limit: number;
  readonly unit: SpeedUnit;
  readonly citation: string;
}

export const LEGAL_CLASSES: Readonly<Record<LegalClassId, LegalClass>> = {
  'eu-pedelec': {
    id: 'eu-pedelec',
    name: 'EU pedelec',
    limit: 25,
    unit: 'kmh',
    citation: 'Regulation (EU) 168/2013 Art. 2(2)(h); EN 15194',
  },
  'us-class-1': { id: 'us-class-1', name: 'US class 1', limit: 20, unit: 'mph', citation: '36 CFR 1.4; 15 U.S.C. 2085' },
  'us-class-2': { id: 'us-class-2', name: 'US class 2', limit: 20, unit: 'mph', citation: '36 CFR 1.4; 15 U.S.C. 2085' },
  'us-class-3': { id: 'us-class-3', name: 'US class 3', limit: 28, unit: 'mph', citation: '36 CFR 1.4' },
};

/**
 * Relative allowance for float round-off only: a speed logged as exactly 25 km/h comes back as
 * 24.999999999999996 or 25.000000000000004 after km/h → m/s → km/h. A billionth is far below any
 * speed sensor's resolution, so anything beyond it is a real excess.
 */
const ROUND_OFF = 1e-9;

/**
 * The boundary rule, stated once: a speed AT the limit is not over it; any speed beyond it is.
 * (15 U.S.C. 2085 words the federal limit as "less than 20 mph"; we flag only above the limit
 * because the flag asks a person to look, and a run at exactly the limit is within every class text.)
 */
export function exceedsLimit(speedMs: number, limitMs: number): boolean {
  return speedMs > limitMs * (1 + ROUND_OFF);
}

export interface LegalSpeedCheck {
  readonly legalClass: LegalClass;
  readonly limitMs: number;
  /** Top speed under motor power, m/s; null when no sample was under motor power. */
  readonly topSpeedUnderPowerMs: number | null;
  /** True → show "possible limiter tampering" to the rep. Never a denial on its own. */
  readonly possibleTampering: boolean;
  /** How far above (positive) or below the limit, in m/s. */
  readonly marginMs: number | null;
  readonly message: string;
}

export function checkLegalSpeed(topSpeedUnderPowerMs: number | null, classId: LegalClassId): LegalSpeedCheck {
  const legalClass = LEGAL_CLASSES[classId];
  const limitMs = toSi('speed', legalClass.limit, legalClass.unit);
  const system = legalClass.unit === 'mph' ? 'imperial' : 'metric';
  const limitText = `${legalClass.limit} ${legalClass.unit === 'mph' ? 'mph' : 'km/h'}`;
  if (topSpeedUnderPowerMs === null) {
    return {
      legalClass,
      limitMs,
      topSpeedUnderPowerMs,
      possibleTampering: false,
      marginMs: null,
      message: `No sample was under motor power, so the ${limitText} limit of its class, ${legalClass.name} (${legalClass.citation}), could not be checked.`,
    };
  }
  const over = exceedsLimit(topSpeedUnderPowerMs, limitMs);
  // Two decimals, so a run just over the limit does not read as equal to it.
  const shown = formatQuantity('speed', topSpeedUnderPowerMs, system, 2).text;
  const margin = topSpeedUnderPowerMs - limitMs;
  const message = over
    ? `Possible limiter tampering: the top speed under motor power, ${shown}, is above the ${limitText} limit of its class, ${legalClass.name} (${legalClass.citation}). Review the run and the bike; this alone is no reason to deny the claim.`
    : `The top speed under motor power, ${shown}, is within the ${limitText} limit of its class, ${legalClass.name} (${legalClass.citation}).`;
  return { legalClass, limitMs, topSpeedUnderPowerMs, possibleTampering: over, marginMs: margin, message };
}

/** Limit of a class in a display unit, e.g. for a chart's limit line. */
export function legalLimitIn(classId: LegalClassId, unit: SpeedUnit): number {
  const c = LEGAL_CLASSES[classId];
  return fromSi('speed', toSi('speed', c.limit, c.unit), unit);
}
