/** Wheel speed and power relations used by the dyno analysis, for callers and tests. */

/** rpm → rad/s: ω = 2π·n/60. */
export function rpmToRadS(rpm: number): number {
  return (2 * Math.PI * rpm) / 60;
}

/** Wheel angular speed from road (roller) speed: ω = v/r = 2π·v/C, in rad/s. */
export function wheelAngularSpeed(speedMs: number, circumferenceM: number): number {
  return (2 * Math.PI * speedMs) / circumferenceM;
}

/** Wheel revolutions per minute: n = v·60/C. */
export function wheelRpm(speedMs: number, circumferenceM: number): number {
  return (speedMs * 60) / circumferenceM;
}

/** P = T·ω (W from N·m and rad/s). */
export function powerFromTorque(torqueNm: number, omegaRadS: number): number {
  return torqueNm * omegaRadS;
}

/** T = P/ω (N·m from W and rad/s); NaN when the wheel stands still. */
export function torqueFromPower(powerW: number, omegaRadS: number): number {
  return omegaRadS > 0 ? powerW / omegaRadS : NaN;
}
