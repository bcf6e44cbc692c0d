import { describe, expect, it } from 'vitest';
import { afterFailure, LOCK_MINUTES, lockRemainingMinutes, MAX_FAILURES, WINDOW_MINUTES } from '@/lib/auth/throttle';

const t0 = new Date('2026-12-01T10:00:00Z');
const plus = (min: number) => new Date(t0.getTime() + min * 60_000);

describe('sign-in throttle', () => {
  it(`locks after ${MAX_FAILURES} failures inside the window, for ${LOCK_MINUTES} minutes`, () => {
    let row = null;
    for (let i = 1; i < MAX_FAILURES; i++) {
      row = afterFailure(row, plus(i));
      expect(row.lockedUntil).toBeNull();
      expect(row.failures).toBe(i);
    }
    row = afterFailure(row, plus(MAX_FAILURES));
    expect(row.lockedUntil).toEqual(plus(MAX_FAILURES + LOCK_MINUTES));
    expect(lockRemainingMinutes(row, plus(MAX_FAILURES))).toBe(LOCK_MINUTES);
    expect(lockRemainingMinutes(row, plus(MAX_FAILURES + LOCK_MINUTES - 0.5))).toBe(1);
    expect(lockRemainingMinutes(row, plus(MAX_FAILURES + LOCK_MINUTES))).toBe(0);
  });

  it('a failure while locked keeps the lock (it neither lifts nor restarts it)', () => {
    let row = null;
    for (let i = 1; i <= MAX_FAILURES; i++) row = afterFailure(row, plus(i));
    const locked = row!;
    expect(afterFailure(locked, plus(MAX_FAILURES + 1))).toEqual(locked);
    expect(lockRemainingMinutes(afterFailure(locked, plus(MAX_FAILURES + 1)), plus(MAX_FAILURES + 1))).toBe(LOCK_MINUTES - 1);
  });

  it('starts counting afresh once the window has passed', () => {
    let row = afterFailure(null, t0);
    for (let i = 0; i < MAX_FAILURES - 2; i++) row = afterFailure(row, plus(1));
    expect(row.failures).toBe(MAX_FAILURES - 1);
    row = afterFailure(row, plus(WINDOW_MINUTES + 1));
    expect(row.failures).toBe(1);
    expect(row.lockedUntil).toBeNull();
  });
});
