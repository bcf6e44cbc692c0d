/**
 * Exact definitions from NIST Special Publication 811 (2008), Appendix B.
 * Derived factors are computed from these so that no rounded table value creeps in.
 */

/** pound-force in newtons (exact; NIST SP 811 B.8 footnote). */
export const LBF_N = 4.4482216152605;
/** foot in metres (exact). */
export const FT_M = 0.3048;
/** inch in metres (exact). */
export const INCH_M = 0.0254;
/** international mile in metres (exact). */
export const MILE_M = 1609.344;
/** avoirdupois pound in kilograms (exact). */
export const LB_KG = 0.45359237;
/** hour in seconds. */
export const HOUR_S = 3600;
/** bar in pascals (exact). */
export const BAR_PA = 100_000;

/** horsepower (550 ft·lbf/s) in watts ≈ 745.699 871 582 27. */
export const HP_W = 550 * FT_M * LBF_N;
/** foot pound-force (torque) in newton metres ≈ 1.355 817 948 331 4. */
export const LBF_FT_NM = FT_M * LBF_N;
/** mile per hour in metres per second (exactly 0.447 04). */
export const MPH_MS = MILE_M / HOUR_S;
/** pound-force per square inch in pascals ≈ 6 894.757 293 168. */
export const PSI_PA = LBF_N / (INCH_M * INCH_M);
