import { describe, expect, it } from 'vitest';
import { BRAND_ROLES, DEALER_ROLES, HOME_PATH, invitableRoles, navFor, roleFitsKind, ROLES } from '@/lib/auth/roles';

describe('role and organisation rules', () => {
  it('a dealer shop holds only dealer roles, a brand only brand roles', () => {
    for (const r of DEALER_ROLES) {
      expect(roleFitsKind(r, 'dealer')).toBe(true);
      expect(roleFitsKind(r, 'brand')).toBe(false);
    }
    for (const r of BRAND_ROLES) {
      expect(roleFitsKind(r, 'brand')).toBe(true);
      expect(roleFitsKind(r, 'dealer')).toBe(false);
    }
  });

  it('only admins invite, and only roles of their own kind', () => {
    expect(invitableRoles('dealer_admin', 'dealer')).toEqual(['dealer', 'dealer_admin']);
    expect(invitableRoles('brand_admin', 'brand')).toEqual(['brand_rep', 'warehouse', 'accountant', 'brand_admin']);
    for (const r of ['dealer', 'brand_rep', 'warehouse', 'accountant'] as const) {
      expect(invitableRoles(r, r === 'dealer' ? 'dealer' : 'brand')).toEqual([]);
    }
    // An admin role on the wrong kind of organisation gets nothing (cannot happen in the DB either).
    expect(invitableRoles('brand_admin', 'dealer')).toEqual([]);
  });

  it('every role has its own home and its home is in its navigation', () => {
    const homes = new Set<string>();
    for (const r of ROLES) {
      expect(navFor(r).map((n) => n.href)).toContain(HOME_PATH[r]);
      homes.add(HOME_PATH[r]);
    }
    expect(homes.size).toBe(5); // both dealer roles share the claims list
  });
});
