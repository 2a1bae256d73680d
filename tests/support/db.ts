/** Direct database access for integration-test fixtures (the same PostgreSQL the app uses). */
import crypto from "node:crypto";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { users, workspaces } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import type { Role } from "@/lib/auth/roles";

export const TEST_PASSWORD = "integration-pass-123";

export function uniqueEmail(prefix: string) {
  return `${prefix}.${crypto.randomBytes(4).toString("hex")}@tests.example`;
}

export async function createWorkspace(name = `Test Works ${crypto.randomBytes(3).toString("hex")}`) {
  const [row] = await db()
    .insert(workspaces)
    .values({ name, slug: `test-${crypto.randomBytes(5).toString("hex")}` })
    .returning();
  return row;
}

export async function createUser({
  workspaceId,
  roles,
  email = uniqueEmail(roles.join("-")),
  password = TEST_PASSWORD,
  active = true,
}: {
  workspaceId: string;
  roles: Role[];
  email?: string;
  password?: string | null;
  active?: boolean;
}) {
  const [row] = await db()
    .insert(users)
    .values({ workspaceId, email, name: `Test ${roles.join("/")}`, roles, active, passwordHash: password ? await hashPassword(password) : null })
    .returning();
  return row;
}

export async function workspaceBySlug(slug: string) {
  const [row] = await db().select().from(workspaces).where(eq(workspaces.slug, slug));
  if (!row) throw new Error(`No workspace ${slug}; was the demo seed run?`);
  return row;
}
