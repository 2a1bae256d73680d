import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { ownerDb } from "../support/owner-db";
import { api, signIn, trySignIn } from "../support/http";
import { uniqueEmail } from "../support/db";
import { latestLinkTo, messagesTo, tokenFromLink } from "../support/inbox";

const count = async (table: string) => (await db().execute<{ n: number }>(sql.raw(`SELECT count(*)::int AS n FROM ${table}`))).rows[0].n;

describe("sign-up", () => {
  it("e-mails a confirmation link; using it creates a workspace whose first user is its lead", async () => {
    const email = uniqueEmail("founder");
    const ws = await count("workspaces");
    const res = await api<{ message: string }>(null, "POST", "/api/signup", { companyName: "Brannock Test Spares", name: "Fay Founder", email });
    expect(res.status).toBe(202);
    expect(res.body.message).toMatch(/Check your inbox/);
    // Nothing exists until the address is confirmed.
    expect(await count("workspaces")).toBe(ws);
    const token = tokenFromLink(await latestLinkTo(email));
    const set = await api<{ message: string }>(null, "POST", "/api/password/set", { token, password: "founder-password" });
    expect(set.status).toBe(200);
    expect(set.body.message).toMatch(/workspace is ready/);
    const { session } = await trySignIn(email, "founder-password");
    const me = await api<{ user: { roles: string[]; workspaceId: string; workspaceName: string } }>(session, "GET", "/api/me");
    expect(me.body.user).toMatchObject({ roles: ["lead"], workspaceName: "Brannock Test Spares" });
    const people = await api<{ people: { email: string }[] }>(session, "GET", "/api/people");
    expect(people.body.people.map((p) => p.email)).toEqual([email]);
    const suppliers = await api<{ suppliers: unknown[] }>(session, "GET", "/api/suppliers");
    expect(suppliers.body.suppliers).toEqual([]);
    // The link works once.
    expect((await api(null, "POST", "/api/password/set", { token, password: "founder-password-2" })).status).toBe(400);
    expect(await count("workspaces")).toBe(ws + 1);
  });

  const bad: [string, unknown][] = [
    ["empty", {}],
    ["wrong types", { companyName: 1, name: true, email: [] }],
    ["oversized company", { companyName: "c".repeat(300), name: "Big", email: "big2@tests.example" }],
    ["bad e-mail", { companyName: "Mailless Works", name: "M", email: "not-mail" }],
    ["a password (chosen through the link instead)", { companyName: "Early Works", name: "E", email: "early@tests.example", password: "long-enough-pass" }],
  ];
  it.each(bad)("%s → 400, nothing stored", async (_n, body) => {
    const [ws, us, requests] = [await count("workspaces"), await count("users"), await count("sign_up_requests")];
    const res = await api<{ error: { message: string; fieldErrors: Record<string, string> } }>(null, "POST", "/api/signup", body);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/not valid|Unknown field/);
    expect([await count("workspaces"), await count("users"), await count("sign_up_requests")]).toEqual([ws, us, requests]);
  });

  it("an address that has an account gets the same answer, a note by e-mail, and nothing is created", async () => {
    const [ws, requests] = [await count("workspaces"), await count("sign_up_requests")];
    const unknown = await api<{ message: string }>(null, "POST", "/api/signup", { companyName: "Fresh Works", name: "F", email: "Fresh.Person@tests.example" });
    const known = await api<{ message: string }>(null, "POST", "/api/signup", { companyName: "Dupe Works", name: "D", email: "Inspector2@Vellmoor.example" });
    expect(known.status).toBe(unknown.status);
    expect(known.body.message.replace("inspector2@vellmoor.example", "X")).toBe(unknown.body.message.replace("fresh.person@tests.example", "X"));
    expect(await count("workspaces")).toBe(ws);
    expect(await count("sign_up_requests")).toBe(requests + 1);
    const note = (await messagesTo("inspector2@vellmoor.example")).at(-1)!;
    expect(note.subject).toBe("You already have a Partproof account");
    expect(note.text).not.toMatch(/set-password/);
  });
});

describe("suppliers", () => {
  it("a lead creates and edits one; names are unique per workspace, case-insensitively", async () => {
    const lead = await signIn("lead@vellmoor.example");
    const name = `Halvering Parts ${Date.now()}`;
    const created = await api<{ supplier: { id: string } }>(lead, "POST", "/api/suppliers", { name, contactEmail: "Desk@Halvering.example" });
    expect(created.status).toBe(201);
    const got = await api<{ supplier: { contactEmail: string } }>(lead, "GET", `/api/suppliers/${created.body.supplier.id}`);
    expect(got.body.supplier.contactEmail).toBe("desk@halvering.example");
    const dupe = await api<{ error: { message: string } }>(lead, "POST", "/api/suppliers", { name: name.toUpperCase(), contactEmail: "x@halvering.example" });
    expect(dupe.status).toBe(409);
    // The same name is fine in another workspace.
    const other = await signIn("lead@quillfen.example");
    expect((await api(other, "POST", "/api/suppliers", { name, contactEmail: "x@halvering.example" })).status).toBe(201);
  });

  it("bad input → 400 and nothing stored", async () => {
    const lead = await signIn("lead@vellmoor.example");
    const before = await count("suppliers");
    for (const body of [
      {},
      { name: "X" },
      { name: "Fine Name", contactEmail: "nope" },
      { name: "Fine Name", contactEmail: "a@b.example", notes: "n".repeat(3000) },
      { name: "Fine Name", contactEmail: "a@b.example", workspaceId: "x" },
    ]) {
      const res = await api(lead, "POST", "/api/suppliers", body);
      expect(res.status, JSON.stringify(body)).toBe(400);
    }
    expect(await count("suppliers")).toBe(before);
    expect((await api(lead, "GET", "/api/suppliers?page=2")).status).toBe(400);
  });
});

describe("activity log", () => {
  it("is append-only: the database refuses UPDATE and DELETE", async () => {
    expect(await count("activity_log")).toBeGreaterThan(0);
    // drizzle wraps the PostgreSQL error; the trigger's message is on the cause.
    const refusal = (e: unknown) => String((e as { cause?: { message?: string } }).cause?.message);
    // As the tables' owner (the app's own role may not even try: db-role.test.ts).
    await expect(
      ownerDb()
        .execute(sql`UPDATE activity_log SET action = 'tampered'`)
        .catch((e) => Promise.reject(refusal(e))),
    ).rejects.toMatch(/append-only \(UPDATE refused\)/);
    await expect(
      ownerDb()
        .execute(sql`DELETE FROM activity_log`)
        .catch((e) => Promise.reject(refusal(e))),
    ).rejects.toMatch(/append-only \(DELETE refused\)/);
  });
});
