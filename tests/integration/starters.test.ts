/**
 * A new company's first day over HTTP (no mocks): the starter part types chosen at sign-up (created
 * when the confirmation link is used), each with its views, zones and checklist and an example
 * rubric as a draft (examples to adapt, c), and adding starters later from an empty Part types
 * screen.
 */
import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { api, trySignIn, type Session } from "../support/http";
import { uniqueEmail } from "../support/db";
import { latestLinkTo, tokenFromLink } from "../support/inbox";

type PartTypeRow = { id: string; slug: string; name: string; views: { key: string; zones: unknown[] }[]; checklist: unknown[] };
type Versions = { versions: { version: number; status: string; rubric: { rules: unknown[]; notes?: string[] } }[] };
const count = async (table: string) => (await db().execute<{ n: number }>(sql.raw(`SELECT count(*)::int AS n FROM ${table}`))).rows[0].n;

/** Signs a company up as a person does: the form, the confirmation link, the password, sign-in. */
async function signUp(starterPartTypes?: string[]): Promise<{ status: number; session: Session | null; body: unknown }> {
  const email = uniqueEmail("starter");
  const body = { companyName: `Starter Works ${Date.now().toString(36)}`, name: "Sol Starter", email, ...(starterPartTypes ? { starterPartTypes } : {}) };
  const res = await api(null, "POST", "/api/signup", body);
  if (res.status !== 202) return { status: res.status, body: res.body, session: null };
  const set = await api(null, "POST", "/api/password/set", { token: tokenFromLink(await latestLinkTo(email)), password: "starter-password" });
  expect(set.status).toBe(200);
  return { status: res.status, body: res.body, session: (await trySignIn(email, "starter-password")).session! };
}

describe("starter part types", () => {
  it("sign-up creates the chosen starters, each with a draft example rubric and no published one", async () => {
    const { status, session } = await signUp(["battery", "display"]);
    expect(status).toBe(202);
    const { partTypes } = (await api<{ partTypes: PartTypeRow[] }>(session!, "GET", "/api/part-types")).body;
    expect(partTypes.map((p) => p.slug).sort()).toEqual(["battery", "display"]);
    const display = partTypes.find((p) => p.slug === "display")!;
    expect(display.views.find((v) => v.key === "screen-white")?.zones).toHaveLength(1);
    expect(partTypes.every((p) => p.checklist.length > 0)).toBe(true);
    for (const partType of partTypes) {
      const { versions } = (await api<Versions>(session!, "GET", `/api/part-types/${partType.id}/rubrics`)).body;
      expect(versions.map((v) => [v.version, v.status])).toEqual([[1, "draft"]]);
      expect(versions[0].rubric.rules.length).toBeGreaterThan(0);
      expect(versions[0].rubric.notes?.join(" ")).toMatch(/Example rubric to adapt/);
    }
  });

  it("sign-up without starters leaves the workspace empty; an unknown starter is refused and nothing is stored", async () => {
    const plain = await signUp();
    expect((await api<{ partTypes: unknown[] }>(plain.session!, "GET", "/api/part-types")).body.partTypes).toEqual([]);
    const before = [await count("workspaces"), await count("users"), await count("sign_up_requests")];
    const bad = await signUp(["battery", "hoverboard"]);
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toMatch(/Starter part types are/);
    expect([await count("workspaces"), await count("users"), await count("sign_up_requests")]).toEqual(before);
  });

  it("a lead adds starters later; adding them again adds nothing", async () => {
    const { session } = await signUp([]);
    const first = await api<{ created: { name: string }[]; skipped: number }>(session!, "POST", "/api/part-types/starters", { slugs: ["rear-camera", "battery"] });
    expect(first.status).toBe(201);
    expect(first.body.created.map((c) => c.name)).toEqual(["Rear camera module", "Battery"]);
    const again = await api<{ created: unknown[]; skipped: number }>(session!, "POST", "/api/part-types/starters", { slugs: ["battery"] });
    expect(again.body).toEqual({ created: [], skipped: 1 });
    expect((await api(session!, "POST", "/api/part-types/starters", { slugs: [] })).status).toBe(400);
    expect((await api<{ partTypes: unknown[] }>(session!, "GET", "/api/part-types")).body.partTypes).toHaveLength(2);
  });
});
