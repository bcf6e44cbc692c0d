import { MPH_MS } from '@/lib/units';

/**
 * Centred moving-average window for peaks, top speed and the power band. Loggers at up to 1 kHz
 * carry roller and sensor ripple; a single-sample maximum would report the ripple, not the motor.
 * 0.2 s spans only a fraction of a km/h in a sweep, so the curve itself is not flattened.
 */
export const SMOOTHING_WINDOW_S = 0.2;

/**
 * Wheel power above which a sample counts as "under motor power" for the legal-class check: above
 * roller drag and sensor offset, far below any assisted output. A rider pedalling hard alone can
 * exceed it, one reason the flag asks for review and never decides.
 */
export const MOTOR_POWER_THRESHOLD_W = 30;

/**
 * Slowest speed at which torque is derived from power (T = P·r/v) or power and torque are compared.
 * Below walking pace a roller's speed reading is coarse; dividing by it turns noise into torque.
 */
export const MIN_SPEED_FOR_RATIO_MS = 2 / 3.6;

/** The power band is the speed range where power is at least this share of peak power. */
export const POWER_BAND_FRACTION = 0.9;

/**
 * Largest accepted relative difference between reported power and torque × wheel angular speed.
 * A tyre under load rolls 1–3 % shorter than the ISO estimate (common practice, no source) and
 * 1 mm of width moves the estimate by about 0.3 %; 5 % leaves room for both. A larger gap means the
 * power column was computed for another wheel (27.5 or 26 in instead of 29: 5–9 %) or was edited.
 */
export const POWER_TORQUE_TOLERANCE = 0.05;

/**
 * The consistency check looks at samples with at least half of peak power: the part of the curve
 * the verdict rests on (peak and band). Lower down, sensor offset and noise dominate the ratio.
 */
export const CONSISTENCY_MIN_POWER_FRACTION = 0.5;

/** Width of a speed bin in m/s per unit system: 1 km/h or 1 mph. */
export const BIN_WIDTH_MS = { metric: 1 / 3.6, imperial: MPH_MS } as const;
