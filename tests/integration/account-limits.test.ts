/**
 * Limits of the public account endpoints (forgot-password, set-password, sign-up), stored in
 * PostgreSQL, the order of work in set-password, and the atomic issue of one-time links. Each
 * test acts as its own client address.
 */
import { and, eq, isNull, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { db } from "@/db/client";
import { authTokens } from "@/db/schema";
import { setPasswordWithToken } from "@/lib/accounts/passwords";
import type * as passwordModule from "@/lib/auth/password";
import { hashPassword } from "@/lib/auth/password";
import { issueAuthToken } from "@/lib/auth/tokens";
import { api } from "../support/http";
import { createUser, createWorkspace, uniqueEmail } from "../support/db";

// The real argon2 hash, watched: set-password must not compute it for a link that does not exist.
vi.mock("@/lib/auth/password", async (importOriginal) => {
  const real = await importOriginal<typeof passwordModule>();
  return { ...real, hashPassword: vi.fn(real.hashPassword) };
});

let workspaceId: string;
beforeAll(async () => {
  workspaceId = (await createWorkspace()).id;
});

const from = (address: string) => ({ "x-forwarded-for": address });
type ErrorBody = { error: { code: string; message: string } };

function expectTooMany(res: { status: number; body: unknown; headers: Headers }, sentence: RegExp) {
  expect(res.status).toBe(429);
  expect((res.body as ErrorBody).error.message).toMatch(sentence);
  expect(Number(res.headers.get("retry-after"))).toBeGreaterThan(0);
}

describe("forgot password", () => {
  it("allows 3 requests per e-mail an hour, for known and unknown addresses alike", async () => {
    const known = (await createUser({ workspaceId, roles: ["inspector"] })).email;
    const unknown = uniqueEmail("nobody");
    for (const [i, email] of [known, unknown].entries()) {
      for (let n = 0; n < 3; n++) expect((await api(null, "POST", "/api/password/forgot", { email }, from(`203.0.113.${30 + i * 5 + n}`))).status).toBe(200);
      expectTooMany(await api(null, "POST", "/api/password/forgot", { email }, from(`203.0.113.${34 + i * 5}`)), /Too many password-reset requests\. Wait \d+ minutes/);
    }
    // Only three reset links were made for the real account.
    const [row] = (await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM auth_tokens t JOIN users u ON u.id = t.user_id WHERE u.email = ${known} AND t.purpose = 'reset'`)).rows;
    expect(row.n).toBe(3);
  });

  it("allows 10 requests per client address an hour", async () => {
    for (let n = 0; n < 10; n++) expect((await api(null, "POST", "/api/password/forgot", { email: uniqueEmail("spread") }, from("203.0.113.60"))).status).toBe(200);
    expectTooMany(await api(null, "POST", "/api/password/forgot", { email: uniqueEmail("spread") }, from("203.0.113.60")), /Too many password-reset requests/);
    expect((await api(null, "POST", "/api/password/forgot", { email: uniqueEmail("spread") }, from("203.0.113.61"))).status).toBe(200);
  });
});

describe("set password", () => {
  it("checks the token first (unknown tokens answer 400) and allows 10 attempts per address in 15 minutes", async () => {
    for (let n = 0; n < 10; n++) {
      const res = await api<ErrorBody>(null, "POST", "/api/password/set", { token: `unknown-token-${n}-${"x".repeat(30)}`, password: "a-long-enough-password" }, from("203.0.113.70"));
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(/not valid any more/);
    }
    expectTooMany(await api(null, "POST", "/api/password/set", { token: "y".repeat(43), password: "a-long-enough-password" }, from("203.0.113.70")), /Too many attempts to set a password from here/);
  });
});

describe("set password, in-process (the app's own function on the test database)", () => {
  it("looks the link up before computing the slow password hash", async () => {
    vi.mocked(hashPassword).mockClear();
    await expect(setPasswordWithToken({ token: "z".repeat(43), password: "a-long-enough-password", ip: "203.0.113.75" })).rejects.toMatchObject({ status: 400 });
    expect(hashPassword).not.toHaveBeenCalled();
    const user = await createUser({ workspaceId, roles: ["inspector"], password: null });
    const token = await issueAuthToken({ workspaceId, userId: user.id, purpose: "invite", ttlMs: 3_600_000 });
    await setPasswordWithToken({ token, password: "a-long-enough-password", ip: "203.0.113.76" });
    expect(hashPassword).toHaveBeenCalledTimes(1);
  });
});

describe("sign-up", () => {
  it("allows 3 sign-ups per e-mail and 5 per address an hour", async () => {
    const email = uniqueEmail("eager");
    for (let n = 0; n < 3; n++) expect((await api(null, "POST", "/api/signup", { companyName: "Eager Works", name: "Eve", email }, from(`203.0.113.${80 + n}`))).status).toBe(202);
    expectTooMany(await api(null, "POST", "/api/signup", { companyName: "Eager Works", name: "Eve", email }, from("203.0.113.83")), /Too many sign-ups\. Wait \d+ minutes/);
    for (let n = 0; n < 5; n++) expect((await api(null, "POST", "/api/signup", { companyName: "Busy Works", name: "Bo", email: uniqueEmail("busy") }, from("203.0.113.90"))).status).toBe(202);
    expectTooMany(await api(null, "POST", "/api/signup", { companyName: "Busy Works", name: "Bo", email: uniqueEmail("busy") }, from("203.0.113.90")), /Too many sign-ups/);
  });
});

describe("one-time links", () => {
  it("twenty links issued at once for one account leave exactly one that works", async () => {
    const user = await createUser({ workspaceId, roles: ["inspector"] });
    const tokens = await Promise.all(Array.from({ length: 20 }, () => issueAuthToken({ workspaceId, userId: user.id, purpose: "reset", ttlMs: 3_600_000 })));
    expect(new Set(tokens).size).toBe(20);
    const live = await db()
      .select()
      .from(authTokens)
      .where(and(eq(authTokens.userId, user.id), eq(authTokens.purpose, "reset"), isNull(authTokens.usedAt)));
    expect(live).toHaveLength(1);
    const working = await Promise.all(
      tokens.map(async (token) => (await api(null, "POST", "/api/password/set", { token, password: "one-of-twenty-pass" }, from(`198.51.100.${tokens.indexOf(token) + 100}`))).status),
    );
    expect(working.filter((s) => s === 200)).toHaveLength(1);
  });
});
