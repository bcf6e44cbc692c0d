import { describe, expect, it } from 'vitest';
import { safeNextPath } from '@/lib/auth/safe-next';

describe('the page to return to after sign-in', () => {
  it('keeps paths of this site', () => {
    for (const p of ['/people', '/claims?stage=draft', '/claims/0b6f1c8e-0000-4000-8000-000000000000']) expect(safeNextPath(p)).toBe(p);
  });
  it('refuses anything a browser would take to another host', () => {
    for (const p of ['//evil.example', '/\\evil.example', '/\\\\evil.example', 'https://evil.example', 'evil.example', '/ok/\\x', '/ x', ''])
      expect(safeNextPath(p)).toBeUndefined();
    expect(safeNextPath(undefined)).toBeUndefined();
  });
});
