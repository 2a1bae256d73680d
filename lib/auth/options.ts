import "server-only";
import { randomUUID } from "node:crypto";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { isDatabaseUnavailable } from "@/db/errors";
import { getUserByEmail, recordSignIn, revokeSession } from "@/db/queries/users";
import { clientIp } from "./client-ip";
import { servedOverHttps } from "./cookies";
import { verifyPassword } from "./password";
import { beginSignInAttempt, signInSucceeded } from "./rate-limit";
import type { Role } from "./roles";
import { signInSchema } from "./schemas";

/** Messages shown on the sign-in form; next-auth passes a thrown Error's message through. */
export const SIGN_IN_MESSAGES = {
  invalid: "The e-mail address or password is not right.",
  deactivated: "This account has been deactivated. Ask your QC lead to reactivate it.",
  unavailable: "Signing in is not possible right now: the database did not answer in time. Try again in a moment.",
  failed: "Signing in did not work because of a problem on the server. Try again; if it keeps happening, tell your QC lead.",
} as const;

/** A refusal whose sentence the sign-in form shows as it is. */
class SignInRefusal extends Error {}

async function authorizeCredentials(raw: unknown, headers: Record<string, string | string[] | undefined>) {
  const parsed = signInSchema.safeParse(raw);
  if (!parsed.success) throw new SignInRefusal(parsed.error.issues[0]?.message ?? SIGN_IN_MESSAGES.invalid);
  const { email, password } = parsed.data;
  const ip = clientIp(headers);
  // Counted before the password is checked, so parallel guesses cannot outrun the limit.
  const attempt = await beginSignInAttempt({ email, ip });
  if (!attempt.ok) throw new SignInRefusal(attempt.message);
  const user = await getUserByEmail({ email });
  const passwordOk = await verifyPassword(user?.passwordHash ?? null, password);
  if (!user || !passwordOk) throw new SignInRefusal(SIGN_IN_MESSAGES.invalid);
  if (!user.active) throw new SignInRefusal(SIGN_IN_MESSAGES.deactivated);
  await Promise.all([signInSucceeded({ email, ip, taken: attempt.taken }), recordSignIn({ userId: user.id })]);
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    workspaceId: user.workspaceId,
    roles: user.roles as Role[],
    tokenVersion: user.tokenVersion,
  };
}

/** next-auth shows a thrown error's message on the form: anything but a refusal becomes a plain sentence. */
async function authorize(raw: unknown, headers: Record<string, string | string[] | undefined>) {
  try {
    return await authorizeCredentials(raw, headers);
  } catch (err) {
    if (err instanceof SignInRefusal) throw err;
    console.error("Sign-in failed", err);
    throw new Error(isDatabaseUnavailable(err) ? SIGN_IN_MESSAGES.unavailable : SIGN_IN_MESSAGES.failed);
  }
}

const SESSION_MAX_AGE = 12 * 60 * 60;

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: SESSION_MAX_AGE },
  // Secure, __Secure- prefixed cookies exactly when the app is served over https (lib/auth/cookies.ts).
  useSecureCookies: servedOverHttps(process.env.APP_URL ?? process.env.NEXTAUTH_URL ?? ""),
  pages: { signIn: "/sign-in" },
  providers: [
    CredentialsProvider({
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      authorize: (credentials, req) => authorize(credentials, req.headers ?? {}),
    }),
  ],
  events: {
    // Signing out ends this session for good, not only in this browser: a copy of its cookie
    // stops working too (require-user checks the session id against revoked_sessions). The
    // person's sessions on other devices carry on.
    async signOut({ token }) {
      if (token?.sid && token.sub)
        await revokeSession({ sessionId: token.sid, userId: token.sub, expiresAt: new Date(((token.exp as number | undefined) ?? Date.now() / 1000 + SESSION_MAX_AGE) * 1000) });
    },
  },
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        token.sub = user.id;
        token.workspaceId = user.workspaceId;
        token.roles = user.roles;
        token.tokenVersion = user.tokenVersion;
        token.sid = randomUUID();
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
