import { signUpSchema } from "@/lib/auth/schemas";
import { signUp } from "@/lib/accounts/sign-up";
import { handler, parseJson, PUBLIC_MAX_BODY } from "@/lib/http/route";

/** Public: creates a workspace and its first lead. */
export const POST = handler({ public: true }, async (req) => {
  const input = await parseJson(req, signUpSchema.strict(), { maxBytes: PUBLIC_MAX_BODY });
  const created = await signUp(input);
  return Response.json({ workspaceId: created.workspaceId, email: created.email, starterPartTypes: created.starterPartTypes }, { status: 201 });
});
