import type { RoleName } from './lib/account';

declare module '@auth/core/types' {
  interface Session {
    user: {
      id: string;
      role: RoleName;
      name?: string | null;
      email?: string | null;
      image?: string | null;
    };
  }
}

declare module '@auth/core/jwt' {
  interface JWT {
    role: RoleName;
    /** The live session this cookie belongs to (src/lib/server/session.ts). */
    sid?: string;
  }
}
