import { setPasswordSchema } from "@/lib/auth/schemas";
import { setPasswordWithToken } from "@/lib/accounts/passwords";
import { handler, parseJson, PUBLIC_MAX_BODY } from "@/lib/http/route";

/** Public, authorised by the one-time token from an invitation or reset e-mail. */
export const POST = handler({ public: true }, async (req) => {
  const input = await parseJson(req, setPasswordSchema.strict(), { maxBytes: PUBLIC_MAX_BODY });
  const { email } = await setPasswordWithToken(input);
  return Response.json({ email, message: "Your password is set. Sign in with it now." });
});
