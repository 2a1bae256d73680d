/**
 * A new company's first day over HTTP (no mocks): the starter part types chosen at sign-up, each
 * with its views, zones and checklist and an example rubric as a draft (examples to adapt, c), and
 * adding starters later from an empty Part types screen.
 */
import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { api, trySignIn, type Session } from "../support/http";
import { uniqueEmail } from "../support/db";

type PartTypeRow = { id: string; slug: string; name: string; views: { key: string; zones: unknown[] }[]; checklist: unknown[] };
type Versions = { versions: { version: number; status: string; rubric: { rules: unknown[]; notes?: string[] } }[] };
const count = async (table: string) => (await db().execute<{ n: number }>(sql.raw(`SELECT count(*)::int AS n FROM ${table}`))).rows[0].n;

async function signUp(starterPartTypes?: string[]): Promise<{ status: number; session: Session | null; body: unknown }> {
  const email = uniqueEmail("starter");
  const body = { companyName: `Starter Works ${Date.now().toString(36)}`, name: "Sol Starter", email, password: "starter-password", ...(starterPartTypes ? { starterPartTypes } : {}) };
  const res = await api(null, "POST", "/api/signup", body);
  return { status: res.status, body: res.body, session: res.status === 201 ? (await trySignIn(email, "starter-password")).session! : null };
}

describe("starter part types", () => {
  it("sign-up creates the chosen starters, each with a draft example rubric and no published one", async () => {
    const { status, session, body } = await signUp(["battery", "display"]);
    expect(status).toBe(201);
    expect(body).toMatchObject({ starterPartTypes: ["Battery", "Display assembly"] });
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
    const [workspaces, users] = [await count("workspaces"), await count("users")];
    const bad = await signUp(["battery", "hoverboard"]);
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toMatch(/Starter part types are/);
    expect([await count("workspaces"), await count("users")]).toEqual([workspaces, users]);
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
