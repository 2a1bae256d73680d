import "server-only";
import crypto from "node:crypto";
import { db } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { getUserByEmail } from "@/db/queries/users";
import { users, workspaces } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import type { SignUpInput } from "@/lib/auth/schemas";
import { AppError } from "@/lib/errors";
import { isUniqueViolation } from "@/db/errors";
import { addStarterPartTypes } from "@/lib/part-types/starters";
import { slugify } from "./slugify";

export const DUPLICATE_EMAIL_MESSAGE = "An account with this e-mail address already exists. Sign in, or reset your password.";

/** Creates a workspace (the company), its first user, who is its lead, and the starter part types chosen. */
export async function signUp(input: SignUpInput) {
  if (await getUserByEmail({ email: input.email })) {
    throw new AppError("conflict", DUPLICATE_EMAIL_MESSAGE, { fieldErrors: { email: DUPLICATE_EMAIL_MESSAGE } });
  }
  const passwordHash = await hashPassword(input.password);
  try {
    return await db().transaction(async (tx) => {
      const slug = `${slugify(input.companyName)}-${crypto.randomBytes(3).toString("hex")}`;
      const [workspace] = await tx.insert(workspaces).values({ name: input.companyName, slug }).returning();
      const [user] = await tx
        .insert(users)
        .values({ workspaceId: workspace.id, email: input.email, name: input.name, passwordHash, roles: ["lead"] })
        .returning({ id: users.id, email: users.email });
      await logActivity(tx, { workspaceId: workspace.id, actorId: user.id, action: "workspace.created", subjectType: "workspace", subjectId: workspace.id, detail: { name: workspace.name } });
      const starters = await addStarterPartTypes(tx, { workspaceId: workspace.id, actorId: user.id, slugs: input.starterPartTypes });
      return { workspaceId: workspace.id, userId: user.id, email: user.email, starterPartTypes: starters.map((s) => s.name) };
    });
  } catch (err) {
    // Two sign-ups racing for one address: the unique index decides, the loser gets the same message.
    if (isUniqueViolation(err, "users_email_key")) throw new AppError("conflict", DUPLICATE_EMAIL_MESSAGE, { fieldErrors: { email: DUPLICATE_EMAIL_MESSAGE } });
    throw err;
  }
}
