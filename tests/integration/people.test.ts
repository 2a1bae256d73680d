import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { authTokens, outgoingEmails, users } from "@/db/schema";
import { api, signIn, trySignIn, type Session } from "../support/http";
import { uniqueEmail } from "../support/db";
import { latestLinkTo, linkInMessage, messagesTo, tokenFromLink } from "../support/inbox";

let lead: Session;
beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
});

const countUsers = async () => (await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM users`)).rows[0].n;

describe("invitations", () => {
  it("e-mails a one-time link that sets the password, then the person can sign in", async () => {
    const email = uniqueEmail("invitee");
    const res = await api<{ person: { id: string; hasPassword: boolean }; emailSent: boolean }>(lead, "POST", "/api/people", { email, name: "Ivy Invitee", roles: ["inspector", "trainer"] });
    expect(res.status).toBe(201);
    expect(res.body.emailSent).toBe(true);
    expect(res.body.person.hasPassword).toBe(false);

    const link = await latestLinkTo(email);
    expect(link.startsWith(process.env.APP_URL!)).toBe(true);
    const token = tokenFromLink(link);
    const set = await api(null, "POST", "/api/password/set", { token, password: "a-brand-new-password" });
    expect(set.status).toBe(200);
    const { session } = await trySignIn(email, "a-brand-new-password");
    const me = await api<{ user: { roles: string[] } }>(session, "GET", "/api/me");
    expect(me.body.user.roles).toEqual(["inspector", "trainer"]);

    // The link worked once.
    const again = await api<{ error: { message: string } }>(null, "POST", "/api/password/set", { token, password: "another-password-1" });
    expect(again.status).toBe(400);
    expect(again.body.error.message).toMatch(/not valid any more/);
  });

  it("answers alike for an address with an account in another workspace; that invitation cannot be accepted", async () => {
    const unknownEmail = uniqueEmail("stranger");
    const unknown = await api<{ person: { email: string; hasPassword: boolean }; emailSent: boolean; message: string }>(lead, "POST", "/api/people", {
      email: unknownEmail,
      name: "Sam Stranger",
      roles: ["inspector"],
    });
    const known = await api<{ person: { id: string; email: string; hasPassword: boolean }; emailSent: boolean; message: string }>(lead, "POST", "/api/people", {
      email: "Inspector@Quillfen.example",
      name: "Quinn Elsewhere",
      roles: ["inspector"],
    });
    expect(known.status).toBe(unknown.status);
    expect(Object.keys(known.body).sort()).toEqual(Object.keys(unknown.body).sort());
    expect(known.body.message.replace("inspector@quillfen.example", "X")).toBe(unknown.body.message.replace(unknownEmail, "X"));
    expect(known.body.person).toMatchObject({ email: "inspector@quillfen.example", hasPassword: false });
    // The owner of the address is told, and gets no link; their own account is untouched.
    const note = (await messagesTo("inspector@quillfen.example")).at(-1)!;
    expect(note.text).toMatch(/cannot be accepted with it/);
    expect(note.text).not.toMatch(/set-password/);
    expect((await trySignIn("inspector@quillfen.example", "partproof-demo")).signedIn).toBe(true);
    await api(lead, "PATCH", `/api/people/${known.body.person.id}`, { active: false });
  });

  it("is listed in the Outbox with the delivered message", async () => {
    const email = uniqueEmail("outboxed");
    await api(lead, "POST", "/api/people", { email, name: "Olive Outbox", roles: ["auditor"] });
    const list = await api<{ emails: { id: string; toAddress: string; kind: string }[] }>(lead, "GET", "/api/outbox");
    const entry = list.body.emails.find((e) => e.toAddress === email)!;
    expect(entry.kind).toBe("invitation");
    const detail = await api<{ delivered: { to: string; text: string } }>(lead, "GET", `/api/outbox/${entry.id}`);
    expect(detail.body.delivered.to).toContain(email);
    expect(detail.body.delivered.text).toMatch(/set-password\?token=/);
  });

  it("an expired link is refused", async () => {
    const email = uniqueEmail("expired");
    const res = await api<{ person: { id: string } }>(lead, "POST", "/api/people", { email, name: "Ed Expired", roles: ["inspector"] });
    const token = tokenFromLink(await latestLinkTo(email));
    await db()
      .update(authTokens)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(authTokens.userId, res.body.person.id));
    const set = await api(null, "POST", "/api/password/set", { token, password: "late-but-long-enough" });
    expect(set.status).toBe(400);
    const [row] = await db().select().from(users).where(eq(users.id, res.body.person.id));
    expect(row.passwordHash).toBeNull();
  });

  it("resending voids the previous link", async () => {
    const email = uniqueEmail("resend");
    const res = await api<{ person: { id: string } }>(lead, "POST", "/api/people", { email, name: "Rae Resend", roles: ["inspector"] });
    const first = tokenFromLink(await latestLinkTo(email));
    expect((await api(lead, "POST", `/api/people/${res.body.person.id}/invitation`)).status).toBe(200);
    const second = tokenFromLink(await linkInMessage(email, 2));
    expect(second).not.toBe(first);
    expect((await api(null, "POST", "/api/password/set", { token: first, password: "first-link-password" })).status).toBe(400);
    expect((await api(null, "POST", "/api/password/set", { token: second, password: "second-link-password" })).status).toBe(200);
  });
});

describe("bad input to People stores nothing", () => {
  const cases: [string, unknown, RegExp][] = [
    ["empty body", {}, /e-mail|name|role/i],
    ["wrong types", { email: 42, name: ["x"], roles: "lead" }, /e-mail|name|role/i],
    ["oversized name", { email: "big@tests.example", name: "x".repeat(500), roles: ["inspector"] }, /under 120/],
    ["unknown role", { email: "role@tests.example", name: "Rolf", roles: ["admin"] }, /Unknown role/],
    ["no roles", { email: "none@tests.example", name: "Nora", roles: [] }, /at least one role/],
    ["unknown field", { email: "extra@tests.example", name: "Exa", roles: ["inspector"], passwordHash: "x" }, /Unknown field/],
  ];
  it.each(cases)("%s → 400 with a message", async (_name, body, message) => {
    const before = await countUsers();
    const res = await api<{ error: { message: string } }>(lead, "POST", "/api/people", body);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(message);
    expect(await countUsers()).toBe(before);
  });

  it("not JSON → 400", async () => {
    const res = await api<{ error: { message: string } }>(lead, "POST", "/api/people", "{not json", { "content-type": "application/json" });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/not valid JSON/);
  });

  it("a body over 1 MB → 413", async () => {
    const res = await api(lead, "POST", "/api/people", { email: "huge@tests.example", name: "x".repeat(1_100_000), roles: ["inspector"] });
    expect(res.status).toBe(413);
  });

  it("an address already in this workspace (any case) → 409 and no second account, no e-mail", async () => {
    const before = await countUsers();
    const mailsBefore = (await db().select().from(outgoingEmails)).length;
    const res = await api<{ error: { message: string; fieldErrors: Record<string, string> } }>(lead, "POST", "/api/people", {
      email: "Trainer@Vellmoor.example",
      name: "Copy Cat",
      roles: ["inspector"],
    });
    expect(res.status).toBe(409);
    expect(res.body.error.fieldErrors.email).toMatch(/already uses this e-mail address/);
    expect(await countUsers()).toBe(before);
    expect((await db().select().from(outgoingEmails)).length).toBe(mailsBefore);
  });

  it("PATCH with nothing to change, or bad roles → 400 and no change", async () => {
    const people = await api<{ people: { id: string; email: string; roles: string[] }[] }>(lead, "GET", "/api/people");
    const target = people.body.people.find((p) => p.email === "trainer@vellmoor.example")!;
    expect((await api(lead, "PATCH", `/api/people/${target.id}`, {})).status).toBe(400);
    expect((await api(lead, "PATCH", `/api/people/${target.id}`, { roles: ["wizard"] })).status).toBe(400);
    expect((await api(lead, "PATCH", `/api/people/${target.id}`, { active: "no" })).status).toBe(400);
    const [row] = await db().select().from(users).where(eq(users.id, target.id));
    expect(row.roles).toEqual(["trainer"]);
    expect(row.active).toBe(true);
  });
});

describe("forgot password", () => {
  it("answers the same for known and unknown addresses, and the link resets the password", async () => {
    const lead2 = await signIn("lead@vellmoor.example");
    const email = uniqueEmail("forgetful");
    await api(lead2, "POST", "/api/people", { email, name: "Fern Forgetful", roles: ["inspector"] });
    await api(null, "POST", "/api/password/set", { token: tokenFromLink(await latestLinkTo(email)), password: "original-password" });

    const known = await api<{ message: string }>(null, "POST", "/api/password/forgot", { email });
    const unknown = await api<{ message: string }>(null, "POST", "/api/password/forgot", { email: uniqueEmail("ghost") });
    expect(known.status).toBe(200);
    expect(known.body).toEqual(unknown.body);

    const link = await linkInMessage(email, 2);
    const { session: oldSession } = await trySignIn(email, "original-password");
    expect((await api(null, "POST", "/api/password/set", { token: tokenFromLink(link), password: "replacement-password" })).status).toBe(200);
    expect((await trySignIn(email, "original-password")).signedIn).toBe(false);
    expect((await trySignIn(email, "replacement-password")).signedIn).toBe(true);
    // A password change ends sessions opened with the old password.
    expect((await api(oldSession, "GET", "/api/me")).status).toBe(401);
  });

  it("bad input → 400", async () => {
    expect((await api(null, "POST", "/api/password/forgot", { email: "" })).status).toBe(400);
    expect((await api(null, "POST", "/api/password/set", { token: "short", password: "x" })).status).toBe(400);
  });
});
