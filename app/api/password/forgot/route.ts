import { requestPasswordReset } from "@/lib/accounts/passwords";
import { clientIp } from "@/lib/auth/client-ip";
import { forgotPasswordSchema } from "@/lib/auth/schemas";
import { handler, parseJson, PUBLIC_MAX_BODY } from "@/lib/http/route";

/** Public: always the same answer, whether or not the address has an account. */
export const POST = handler({ public: true }, async (req) => {
  const { email } = await parseJson(req, forgotPasswordSchema.strict(), { maxBytes: PUBLIC_MAX_BODY });
  return Response.json(await requestPasswordReset({ email, ip: clientIp(req.headers) }));
});
