import { parseTyreSize, type TyreSize } from './tyre-size';

/**
 * Rolling circumference estimate from the ISO size: π × (BSD + 2 × width), in metres.
 * The tyre's height is taken equal to its width, which is why a measured roll-out beats it.
 */
export function isoCircumferenceM(tyre: Pick<TyreSize, 'widthMm' | 'bsdMm'>): number {
  return (Math.PI * (tyre.bsdMm + 2 * tyre.widthMm)) / 1000;
}

/** Plausible measured roll-out for a bicycle wheel, in mm. */
export const MEASURED_CIRCUMFERENCE_RANGE_MM = [500, 3500] as const;
/** A measurement further than this from the ISO estimate is shown with a "check it" note (common practice, no source). */
export const MEASURED_VS_ESTIMATE_NOTE_PCT = 5;

export interface WheelCircumference {
  readonly metres: number;
  readonly source: 'measured' | 'iso-estimate';
  readonly tyre: TyreSize | null;
  /** ISO estimate, when a tyre size was given. */
  readonly estimateM: number | null;
  readonly notes: readonly string[];
}

export type WheelCircumferenceResult =
  | ({ readonly ok: true } & WheelCircumference)
  | { readonly ok: false; readonly field: 'tyre' | 'measuredMm'; readonly message: string };

/**
 * The circumference used to turn roller speed into wheel angular speed. A measured roll-out,
 * when given, wins over the ISO estimate.
 */
export function wheelCircumference(input: { tyre?: TyreSize | string | null; measuredMm?: number | null }): WheelCircumferenceResult {
  const notes: string[] = [];
  let tyre: TyreSize | null = null;
  if (typeof input.tyre === 'string') {
    const parsed = parseTyreSize(input.tyre);
    if (!parsed.ok) return { ok: false, field: 'tyre', message: parsed.message };
    tyre = parsed.tyre;
    if (parsed.note) notes.push(parsed.note);
  } else if (input.tyre) {
    tyre = input.tyre;
  }
  const estimateM = tyre ? isoCircumferenceM(tyre) : null;

  const measured = input.measuredMm;
  if (measured !== undefined && measured !== null) {
    const [lo, hi] = MEASURED_CIRCUMFERENCE_RANGE_MM;
    if (!Number.isFinite(measured) || measured < lo || measured > hi) {
      return { ok: false, field: 'measuredMm', message: `Measured circumference ${measured} mm is outside ${lo}–${hi} mm; measure one full wheel turn on the ground, in millimetres.` };
    }
    const metres = measured / 1000;
    if (estimateM !== null) {
      const diffPct = ((metres - estimateM) / estimateM) * 100;
      if (Math.abs(diffPct) > MEASURED_VS_ESTIMATE_NOTE_PCT) {
        notes.push(`The measured ${measured} mm differs by ${diffPct.toFixed(1)} % from the ${Math.round(estimateM * 1000)} mm expected for ${tyre?.iso}; check the measurement and the tyre size.`);
      }
    }
    return { ok: true, metres, source: 'measured', tyre, estimateM, notes };
  }
  if (estimateM === null) {
    return { ok: false, field: 'tyre', message: 'Enter the tyre size (e.g. 57-622) or a measured wheel circumference in mm.' };
  }
  return { ok: true, metres: estimateM, source: 'iso-estimate', tyre, estimateM, notes };
}
