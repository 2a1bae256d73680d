import { sql } from "drizzle-orm";
import { db } from "@/db/client";
import { guardedRoute } from "@/lib/http/api-guard";

export const dynamic = "force-dynamic";

/** Liveness for scripts and Playwright: the app answers and its database does too. */
export const GET = guardedRoute(async () => {
  try {
    await db().execute(sql`SELECT 1`);
    return Response.json({ app: "partproof", ok: true });
  } catch {
    return Response.json({ app: "partproof", ok: false, error: { code: "unavailable", message: "The database is not reachable." } }, { status: 503 });
  }
});
