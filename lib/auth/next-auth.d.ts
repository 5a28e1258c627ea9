import "next-auth";
import "@auth/core/jwt";

declare module "next-auth" {
  interface Session {
    user: { id: string; name?: string | null; email?: string | null; image?: string | null };
    /** The user's session version when this session was signed in (-1 for a token without one). */
    sessionVersion: number;
  }
}

declare module "@auth/core/jwt" {
  interface JWT {
    sv?: number;
  }
}
