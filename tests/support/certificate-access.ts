/** Fixture ids for the certificate routes in the access matrix: a certificate of the graded fixture unit. */
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { units } from "@/db/schema";
import { api, type Session } from "./http";

export async function certificateFixtureIds(lead: Session, unitId: string): Promise<Record<string, string>> {
  // A certificate names the part it vouches for: the fixture unit gets a serial first.
  await db()
    .update(units)
    .set({ serial: `CERT-FX-${unitId.slice(0, 8)}` })
    .where(eq(units.id, unitId));
  const issued = await api<{ certificate: { id: string } }>(lead, "POST", `/api/units/${unitId}/certificates`, {});
  if (issued.status !== 201) throw new Error(`Fixture certificate failed: ${JSON.stringify(issued.body)}`);
  return { certificateId: issued.body.certificate.id };
}
