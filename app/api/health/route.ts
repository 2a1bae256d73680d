import { pingDatabase } from "@/db/queries/health";
import { handler } from "@/lib/http/route";

export const dynamic = "force-dynamic";

/** Liveness for scripts and Playwright: the app answers and its database does too. */
export const GET = handler({ public: true }, async () => {
  try {
    await pingDatabase();
    return Response.json({ app: "partproof", ok: true });
  } catch {
    return Response.json({ app: "partproof", ok: false, error: { code: "unavailable", message: "The database is not reachable." } }, { status: 503 });
  }
});
