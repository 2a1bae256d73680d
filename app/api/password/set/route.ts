import { setPasswordWithToken } from "@/lib/accounts/passwords";
import { clientIp } from "@/lib/auth/client-ip";
import { setPasswordSchema } from "@/lib/auth/schemas";
import { handler, parseJson, PUBLIC_MAX_BODY } from "@/lib/http/route";

/** Public, authorised by the one-time token from an invitation, reset or sign-up e-mail. */
export const POST = handler({ public: true }, async (req) => {
  const input = await parseJson(req, setPasswordSchema.strict(), { maxBytes: PUBLIC_MAX_BODY });
  return Response.json(await setPasswordWithToken({ ...input, ip: clientIp(req.headers) }));
});
