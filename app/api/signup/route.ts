import { requestSignUp } from "@/lib/accounts/sign-up";
import { limitSignUp } from "@/lib/accounts/public-limits";
import { clientIp } from "@/lib/auth/client-ip";
import { signUpSchema } from "@/lib/auth/schemas";
import { handler, parseJson, PUBLIC_MAX_BODY } from "@/lib/http/route";

/** Public: e-mails a confirmation link (or, for a known address, a note); the same answer either way. */
export const POST = handler({ public: true }, async (req) => {
  const input = await parseJson(req, signUpSchema.strict(), { maxBytes: PUBLIC_MAX_BODY });
  await limitSignUp({ ip: clientIp(req.headers), email: input.email });
  return Response.json(await requestSignUp(input), { status: 202 });
});
