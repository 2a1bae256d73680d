import { handler } from "@/lib/http/route";
import { adjudicationsFor } from "@/lib/recheck/adjudication-view";

/** Disagreements waiting for a decision that the caller may settle (never their own grades). */
export const GET = handler({ permission: "recheck.adjudicate" }, async (_req, _ctx, user) => {
  return Response.json({ adjudications: await adjudicationsFor(user) });
});
