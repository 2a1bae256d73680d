/**
 * The mail server is down when a lead invites someone: the invitation is still made, its e-mail
 * is queued (the lead is told, People shows it pending) and the worker sends it once the server
 * is back — without anyone resending. The local inbox is stopped and started for real. The
 * queued job never shows the invitation's one-time link to whoever can read the database.
 */
import { and, eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, expect, it } from "vitest";
import { db } from "@/db/client";
import { outgoingEmails } from "@/db/schema";
import { api, signIn, type Session } from "../support/http";
import { uniqueEmail } from "../support/db";
import { latestLinkTo, messagesTo, tokenFromLink } from "../support/inbox";
import { serviceControl } from "../support/services";

let lead: Session;
let mailDown = false;

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
});

afterAll(async () => {
  if (mailDown) await serviceControl("mail", "start");
});

type Person = { id: string; email: string; hasPassword: boolean; invitationEmail: string | null };

it("an invitation sent while the mail server is down is queued, shown pending, and delivered once it is back", { timeout: 90_000 }, async () => {
  const email = uniqueEmail("mail-outage");
  await serviceControl("mail", "stop");
  mailDown = true;

  const res = await api<{ person: Person; emailSent: boolean; emailQueued: boolean; message: string }>(lead, "POST", "/api/people", { email, name: "Otto Outage", roles: ["inspector"] });
  expect(res.status).toBe(201);
  expect(res.body).toMatchObject({ emailSent: false, emailQueued: true });
  expect(res.body.message).toMatch(/queued and goes out by itself/);
  const listed = await api<{ people: Person[] }>(lead, "GET", "/api/people");
  expect(listed.body.people.find((p) => p.email === email)).toMatchObject({ hasPassword: false, invitationEmail: "queued" });
  const [queued] = await db()
    .select()
    .from(outgoingEmails)
    .where(and(eq(outgoingEmails.toAddress, email), eq(outgoingEmails.kind, "invitation")));
  expect(queued.status).toBe("queued");
  expect(queued.error).toBeTruthy();
  // A few retries fail while the server stays down; nothing arrives, nothing is marked sent.
  await new Promise((r) => setTimeout(r, 3000));
  expect(await messagesTo(email)).toHaveLength(0);

  await serviceControl("mail", "start");
  mailDown = false;
  const link = await latestLinkTo(email, 60_000);
  const rows = await db()
    .select()
    .from(outgoingEmails)
    .where(and(eq(outgoingEmails.toAddress, email), eq(outgoingEmails.kind, "invitation")));
  expect(rows).toHaveLength(1);
  expect(rows[0]).toMatchObject({ status: "sent", error: null });
  expect(rows[0].attempts).toBeGreaterThan(1);
  expect(await messagesTo(email)).toHaveLength(1);
  const after = await api<{ people: Person[] }>(lead, "GET", "/api/people");
  expect(after.body.people.find((p) => p.email === email)?.invitationEmail).toBe("sent");
  // The job that waited in the database all along held the link only sealed.
  const jobs = await db().execute<{ data: string }>(sql`SELECT data::text AS data FROM pgboss.job WHERE name = 'mail-send' AND data->>'emailId' = ${queued.id}`);
  expect(jobs.rows).toHaveLength(1);
  expect(jobs.rows[0].data).not.toContain(tokenFromLink(link));
  expect(jobs.rows[0].data).not.toContain("set-password");
  // The queued link is the invitation's own: it sets the password.
  expect((await api(null, "POST", "/api/password/set", { token: tokenFromLink(link), password: "otto-outage-password" })).status).toBe(200);
});
