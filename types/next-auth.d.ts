import type { Role } from "@/lib/auth/roles";

declare module "next-auth" {
  interface User {
    id: string;
    workspaceId: string;
    roles: Role[];
    tokenVersion: number;
  }
  interface Session {
    user: { id: string; email: string; name: string; workspaceId: string; roles: Role[]; tokenVersion: number };
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    workspaceId: string;
    roles: Role[];
    tokenVersion: number;
    /** This sign-in's id, kept across next-auth's re-issued cookies; revoked at sign-out. */
    sid?: string;
  }
}
