// Who may be what, and where each role starts. Pure rules shared by the server and the UI;
// the database enforces the role/organisation fit again (users_role_fits_org).
export const DEALER_ROLES = ['dealer', 'dealer_admin'] as const;
export const BRAND_ROLES = ['brand_rep', 'warehouse', 'accountant', 'brand_admin'] as const;
export const ROLES = [...DEALER_ROLES, ...BRAND_ROLES] as const;

export type DealerRole = (typeof DEALER_ROLES)[number];
export type BrandRole = (typeof BRAND_ROLES)[number];
export type Role = (typeof ROLES)[number];
export type OrgKind = 'dealer' | 'brand';

export const ROLE_LABELS: Record<Role, string> = {
  dealer: 'Service desk',
  dealer_admin: 'Shop admin',
  brand_rep: 'Warranty rep',
  warehouse: 'Warehouse',
  accountant: 'Accounts',
  brand_admin: 'Brand admin',
};

export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  dealer: 'Files and follows warranty claims for the shop.',
  dealer_admin: 'Files claims, manages the shop’s people and sees its credits.',
  brand_rep: 'Reviews claims against the brand and decides them.',
  warehouse: 'Ships replacements, receives and inspects cores.',
  accountant: 'Issues credit memos, charges back and reconciles statements.',
  brand_admin: 'Keeps the catalog, policies, labor times, prices and people.',
};

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}

export function roleFitsKind(role: Role, kind: OrgKind): boolean {
  return kind === 'dealer'
    ? (DEALER_ROLES as readonly string[]).includes(role)
    : (BRAND_ROLES as readonly string[]).includes(role);
}

export function rolesForKind(kind: OrgKind): readonly Role[] {
  return kind === 'dealer' ? DEALER_ROLES : BRAND_ROLES;
}

export function isAdminRole(role: Role): boolean {
  return role === 'dealer_admin' || role === 'brand_admin';
}

/** Roles an admin may hand out: only those that fit the admin's own organisation. */
export function invitableRoles(adminRole: Role, kind: OrgKind): readonly Role[] {
  if (!isAdminRole(adminRole) || !roleFitsKind(adminRole, kind)) return [];
  return rolesForKind(kind);
}

export const HOME_PATH: Record<Role, string> = {
  dealer: '/claims',
  dealer_admin: '/claims',
  brand_rep: '/review',
  warehouse: '/warehouse',
  accountant: '/accounts',
  brand_admin: '/catalog',
};

export type NavItem = { href: string; label: string };

export function navFor(role: Role): NavItem[] {
  switch (role) {
    case 'dealer':
      return [
        { href: '/claims', label: 'Claims' },
        { href: '/claims/new', label: 'New claim' },
      ];
    case 'dealer_admin':
      return [
        { href: '/claims', label: 'Claims' },
        { href: '/claims/new', label: 'New claim' },
        { href: '/credits', label: 'Credits' },
        { href: '/people', label: 'People' },
      ];
    case 'brand_rep':
      return [{ href: '/review', label: 'Review queue' }];
    case 'warehouse':
      return [
        { href: '/warehouse', label: 'Shipping & cores' },
        { href: '/warehouse/stock', label: 'Stock' },
      ];
    case 'accountant':
      return [
        { href: '/accounts', label: 'Credits to issue' },
        { href: '/accounts/memos', label: 'Memos' },
        { href: '/accounts/statements', label: 'Statements' },
        { href: '/accounts/reports', label: 'Reports' },
      ];
    case 'brand_admin':
      return [
        { href: '/catalog', label: 'Catalog' },
        { href: '/people', label: 'People' },
      ];
  }
}
