import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { TestConditions } from '@/lib/loadtest';
import type { LoadTestSpec } from '@/lib/loadtest-evidence';

export const fixture = (name: string) => readFileSync(path.resolve('tests/fixtures/loadtest', name));

export const conditions = (c: Partial<TestConditions> = {}): TestConditions => ({
  batterySocStartPct: 100, tyreSize: '57-622', measuredCircumferenceMm: null, tyrePressurePa: 400_000, tyreMaxPressurePa: 400_000, dynoId: 'Bench 1',
  rollerId: 'R1', loadKg: 80, ambientTempC: 20, notes: '', ...c,
});

export const dynoSpec = (s: Partial<Extract<LoadTestSpec, { kind: 'dyno' }>> = {}): LoadTestSpec => ({
  kind: 'dyno', minWheelPowerW: 300, minWheelTorqueNm: 24, legalClass: 'eu-pedelec', partNumber: 'TV-DU85', ...s,
});

/** Wheel radius of a 57-622 tyre from π × (BSD + 2 × width) (Sheldon Brown's roll-out estimate). */
export const R_57_622 = (Math.PI * (622 + 2 * 57)) / 1000 / (2 * Math.PI);

/**
 * A sweep from 2 to 25 km/h at exactly `powerW` wheel power throughout, torque = P/ω on a 57-622
 * tyre. A constant signal stays exactly constant under the moving average, so the peak is `powerW`
 * in closed form.
 */
export function constantPowerCsv(powerW: number, n = 600): string {
  const lines = ['time_s,speed_kmh,wheel_torque_nm,wheel_power_w'];
  for (let i = 0; i < n; i++) {
    const kmh = 2 + (23 * i) / (n - 1);
    lines.push(`${(i * 0.05).toFixed(2)},${kmh.toFixed(4)},${(powerW / (kmh / 3.6 / R_57_622)).toFixed(5)},${powerW}`);
  }
  return lines.join('\n') + '\n';
}
