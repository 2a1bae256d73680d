import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { signInFailures, users } from "@/db/schema";
import { api, signIn, trySignIn } from "../support/http";
import { createUser, createWorkspace, TEST_PASSWORD, uniqueEmail } from "../support/db";

let workspaceId: string;
beforeAll(async () => {
  workspaceId = (await createWorkspace()).id;
});

describe("sign-in", () => {
  it("succeeds with the right password and puts the roles in the session", async () => {
    const user = await createUser({ workspaceId, roles: ["inspector", "auditor"] });
    const { session } = await trySignIn(user.email, TEST_PASSWORD);
    expect(session).not.toBeNull();
    const res = await api<{ user: { roles: string[]; workspaceId: string } }>(session, "GET", "/api/auth/session");
    expect(res.body.user.roles).toEqual(["inspector", "auditor"]);
    expect(res.body.user.workspaceId).toBe(workspaceId);
  });

  it("accepts the e-mail in any letter case", async () => {
    const user = await createUser({ workspaceId, roles: ["trainer"] });
    expect((await trySignIn(user.email.toUpperCase(), TEST_PASSWORD)).signedIn).toBe(true);
  });

  it("fails with a wrong password or unknown account, with the same message", async () => {
    const user = await createUser({ workspaceId, roles: ["trainer"] });
    const wrong = await trySignIn(user.email, "not-the-password");
    const unknown = await trySignIn(uniqueEmail("nobody"), "whatever-password");
    expect(wrong.signedIn).toBe(false);
    expect(wrong.error).toBe("The e-mail address or password is not right.");
    expect(unknown.error).toBe(wrong.error);
  });

  it("rejects malformed input with a readable message", async () => {
    const res = await trySignIn("not-an-email", "x");
    expect(res.signedIn).toBe(false);
    expect(res.error).toMatch(/valid e-mail/);
  });

  it("refuses an invited account that has no password yet", async () => {
    const user = await createUser({ workspaceId, roles: ["inspector"], password: null });
    expect((await trySignIn(user.email, "")).signedIn).toBe(false);
    expect((await trySignIn(user.email, "anything-at-all")).signedIn).toBe(false);
  });
});

describe("rate limit", () => {
  it("blocks an account after 5 failures in 15 minutes, even with the right password", async () => {
    const user = await createUser({ workspaceId, roles: ["inspector"] });
    for (let i = 0; i < 5; i++) expect((await trySignIn(user.email, `wrong-${i}`)).error).toMatch(/not right/);
    const blocked = await trySignIn(user.email, TEST_PASSWORD);
    expect(blocked.signedIn).toBe(false);
    expect(blocked.error).toMatch(/Too many failed sign-in attempts\. Wait 15 minutes/);
    // Once the failures are older than the window, the account works again.
    await db().execute(sql`UPDATE sign_in_failures SET created_at = now() - interval '16 minutes' WHERE email = ${user.email}`);
    expect((await trySignIn(user.email, TEST_PASSWORD)).signedIn).toBe(true);
  });

  it("blocks a client address after 20 failures across accounts", async () => {
    const address = { "x-forwarded-for": "203.0.113.77" };
    for (let i = 0; i < 20; i++) await trySignIn(uniqueEmail(`spray${i}`), "wrong-password", address);
    const user = await createUser({ workspaceId, roles: ["inspector"] });
    const blocked = await trySignIn(user.email, TEST_PASSWORD, address);
    expect(blocked.error).toMatch(/Too many failed sign-in attempts/);
    // The same account from another address is not affected.
    expect((await trySignIn(user.email, TEST_PASSWORD, { "x-forwarded-for": "203.0.113.78" })).signedIn).toBe(true);
    await db().delete(signInFailures).where(eq(signInFailures.ip, "203.0.113.77"));
  });
});

describe("deactivation", () => {
  it("stops an existing session on its next request and refuses new sign-ins", async () => {
    const lead = await signIn("lead@vellmoor.example");
    const vellmoorId = (await api<{ user: { workspaceId: string } }>(lead, "GET", "/api/me")).body.user.workspaceId;
    const user = await createUser({ workspaceId: vellmoorId, roles: ["inspector"] });
    const { session } = await trySignIn(user.email, TEST_PASSWORD);
    expect((await api(session, "GET", "/api/me")).status).toBe(200);

    const res = await api(lead, "PATCH", `/api/people/${user.id}`, { active: false });
    expect(res.status).toBe(200);
    const after = await api<{ error: { message: string } }>(session, "GET", "/api/me");
    expect(after.status).toBe(401);
    expect((await trySignIn(user.email, TEST_PASSWORD)).error).toMatch(/deactivated/);

    // Reactivated: they can sign in again, but the old session stays dead.
    await api(lead, "PATCH", `/api/people/${user.id}`, { active: true });
    expect((await api(session, "GET", "/api/me")).status).toBe(401);
    expect((await trySignIn(user.email, TEST_PASSWORD)).signedIn).toBe(true);
  });

  it("applies a role change on the next request", async () => {
    const lead = await signIn("lead@vellmoor.example");
    const vellmoorId = (await api<{ user: { workspaceId: string } }>(lead, "GET", "/api/me")).body.user.workspaceId;
    const user = await createUser({ workspaceId: vellmoorId, roles: ["inspector"] });
    const { session } = await trySignIn(user.email, TEST_PASSWORD);
    expect((await api(session, "GET", "/api/people")).status).toBe(403);
    await api(lead, "PATCH", `/api/people/${user.id}`, { roles: ["inspector", "lead"] });
    expect((await api(session, "GET", "/api/people")).status).toBe(200);
  });

  it("keeps the workspace's last active lead", async () => {
    const ws = await createWorkspace();
    const onlyLead = await createUser({ workspaceId: ws.id, roles: ["lead"] });
    const other = await createUser({ workspaceId: ws.id, roles: ["lead"] });
    const { session } = await trySignIn(onlyLead.email, TEST_PASSWORD);
    expect((await api(session, "PATCH", `/api/people/${other.id}`, { roles: ["inspector"] })).status).toBe(200);
    const selfDemote = await api<{ error: { message: string } }>(session, "PATCH", `/api/people/${onlyLead.id}`, { roles: ["inspector"] });
    expect(selfDemote.status).toBe(409);
    expect(selfDemote.body.error.message).toMatch(/at least one active lead/);
    const [row] = await db().select().from(users).where(eq(users.id, onlyLead.id));
    expect(row.roles).toEqual(["lead"]);
  });
});
