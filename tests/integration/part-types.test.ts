/** Part types over HTTP: seeded catalogue, lead edits, everyone reads, bad input stores nothing. */
import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { api, signIn, type Session } from "../support/http";

type PartType = { id: string; slug: string; name: string; modelFamily: string; inspectAll: boolean; checklist: { id: string; kind: string }[]; views: { key: string }[] };
const count = async () => (await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM part_types`)).rows[0].n;
const valid = (name: string) => ({
  name,
  category: "speaker",
  modelFamily: "Korvo X2",
  views: [
    {
      key: "front",
      label: "Front",
      required: true,
      zones: [
        {
          id: "body",
          label: "Body",
          polygon: [
            [0, 0],
            [1, 0],
            [1, 1],
            [0, 1],
          ],
        },
      ],
    },
  ],
  defectClasses: [{ key: "dent", label: "Dent", severity: "major" }],
  checklist: [{ id: "level", label: "Sound level", kind: "numeric", unit: "dB(A)", min: 75, max: null, decimals: 0, severityOnFail: "minor" }],
});

let lead: Session;
let trainer: Session;
beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  trainer = await signIn("trainer@vellmoor.example");
});

describe("part types", () => {
  it("everyone reads the eight seeded part types with their checklists", async () => {
    const res = await api<{ partTypes: PartType[] }>(trainer, "GET", "/api/part-types");
    const seeded = res.body.partTypes.filter((p) => ["rear-camera", "front-camera", "battery", "back-housing", "display", "charging-flex", "button-flex", "loudspeaker"].includes(p.slug));
    expect(seeded).toHaveLength(8);
    const battery = seeded.find((p) => p.slug === "battery")!;
    expect(battery.checklist.map((i) => i.id)).toEqual(expect.arrayContaining(["swelling", "ocv", "health", "cycle-count"]));
    expect(seeded.find((p) => p.slug === "display")!.inspectAll).toBe(true);
  });

  it("a lead creates one; the name is unique per workspace (case-insensitive)", async () => {
    const name = `Test speaker ${Date.now()}`;
    const created = await api<{ partType: PartType }>(lead, "POST", "/api/part-types", valid(name));
    expect(created.status).toBe(201);
    expect(created.body.partType.slug).toMatch(/^test-speaker-/);
    const dupe = await api<{ error: { fieldErrors: Record<string, string> } }>(lead, "POST", "/api/part-types", valid(name.toUpperCase()));
    expect(dupe.status).toBe(409);
    expect(dupe.body.error.fieldErrors.name).toMatch(/already exists/);
    // PATCH changes only what is sent.
    const patched = await api<{ partType: PartType }>(lead, "PATCH", `/api/part-types/${created.body.partType.id}`, { inspectAll: true });
    expect(patched.body.partType).toMatchObject({ name, inspectAll: true, modelFamily: "Korvo X2" });
    expect(patched.body.partType.checklist).toHaveLength(1);
  });

  const bad: [string, (b: ReturnType<typeof valid>) => unknown][] = [
    ["min above max", (b) => ({ ...b, checklist: [{ ...b.checklist[0], min: 90, max: 80 }] })],
    [
      "zone outside 0..1",
      (b) => ({
        ...b,
        views: [
          {
            ...b.views[0],
            zones: [
              {
                id: "body",
                label: "Body",
                polygon: [
                  [0, 0],
                  [2, 0],
                  [1, 1],
                ],
              },
            ],
          },
        ],
      }),
    ],
    ["no views", (b) => ({ ...b, views: [] })],
    ["bad severity", (b) => ({ ...b, defectClasses: [{ key: "dent", label: "Dent", severity: "cosmetic" }] })],
    ["unknown field", (b) => ({ ...b, workspaceId: "x" })],
    ["duplicate item ids", (b) => ({ ...b, checklist: [b.checklist[0], b.checklist[0]] })],
  ];
  it.each(bad)("%s → 400, nothing stored", async (_name, change) => {
    const before = await count();
    const res = await api<{ error: { message: string } }>(lead, "POST", "/api/part-types", change(valid(`Bad part ${Date.now()}`)));
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/not valid/);
    expect(await count()).toBe(before);
  });

  it("PATCH with nothing, or another workspace's id → 400 / 404", async () => {
    const other = await signIn("lead@quillfen.example");
    const foreign = (await api<{ partTypes: PartType[] }>(other, "GET", "/api/part-types")).body.partTypes[0];
    expect((await api(lead, "PATCH", `/api/part-types/${foreign.id}`, { name: "Stolen" })).status).toBe(404);
    const own = (await api<{ partTypes: PartType[] }>(lead, "GET", "/api/part-types")).body.partTypes[0];
    expect((await api(lead, "PATCH", `/api/part-types/${own.id}`, {})).status).toBe(400);
  });
});
