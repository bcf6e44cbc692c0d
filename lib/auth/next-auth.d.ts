import type { OrgKind, Role } from '@/lib/auth/roles';

declare module 'next-auth' {
  interface User {
    id: string;
    role: Role;
    organisationId: string;
    orgKind: OrgKind;
  }
  interface Session {
    user: { id: string; name: string; email: string; role: Role; organisationId: string; orgKind: OrgKind };
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    uid: string;
    role: Role;
    organisationId: string;
    orgKind: OrgKind;
  }
}
