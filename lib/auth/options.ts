import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { getUserByEmail, recordSignIn } from "@/db/queries/users";
import { AppError } from "@/lib/errors";
import { clientIp } from "./client-ip";
import { verifyPassword } from "./password";
import { assertSignInAllowed, clearSignInFailures, recordSignInFailure } from "./rate-limit";
import type { Role } from "./roles";
import { signInSchema } from "./schemas";

/** Messages shown on the sign-in form; next-auth passes a thrown Error's message through. */
export const SIGN_IN_MESSAGES = {
  invalid: "The e-mail address or password is not right.",
  deactivated: "This account has been deactivated. Ask your QC lead to reactivate it.",
} as const;

async function authorizeCredentials(raw: unknown, headers: Record<string, string | string[] | undefined>) {
  const parsed = signInSchema.safeParse(raw);
  if (!parsed.success) throw new Error(parsed.error.issues[0]?.message ?? SIGN_IN_MESSAGES.invalid);
  const { email, password } = parsed.data;
  const ip = clientIp(headers);
  try {
    await assertSignInAllowed({ email, ip });
  } catch (err) {
    if (err instanceof AppError) throw new Error(err.message);
    throw err;
  }
  const user = await getUserByEmail({ email });
  const passwordOk = await verifyPassword(user?.passwordHash ?? null, password);
  if (!user || !passwordOk) {
    await recordSignInFailure({ email, ip });
    throw new Error(SIGN_IN_MESSAGES.invalid);
  }
  if (!user.active) throw new Error(SIGN_IN_MESSAGES.deactivated);
  await Promise.all([clearSignInFailures({ email }), recordSignIn({ userId: user.id })]);
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    workspaceId: user.workspaceId,
    roles: user.roles as Role[],
    tokenVersion: user.tokenVersion,
  };
}

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  pages: { signIn: "/sign-in" },
  providers: [
    CredentialsProvider({
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      authorize: (credentials, req) => authorizeCredentials(credentials, req.headers ?? {}),
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        token.sub = user.id;
        token.workspaceId = user.workspaceId;
        token.roles = user.roles;
        token.tokenVersion = user.tokenVersion;
      }
      return token;
    },
    session({ session, token }) {
      session.user = {
        id: token.sub ?? "",
        email: token.email ?? "",
        name: token.name ?? "",
        workspaceId: token.workspaceId,
        roles: token.roles,
        tokenVersion: token.tokenVersion,
      };
      return session;
    },
  },
};
