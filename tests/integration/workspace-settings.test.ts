/**
 * The workspace's time zone (one rule for every time shown) and the app's own icon, over HTTP
 * against the test server (no mocks). Zone names are IANA tz database names (a, the runtime's
 * Intl list); a fresh workspace is used so the demo workspace stays in UTC for the other tests.
 */
import { describe, expect, it } from "vitest";
import { BASE_URL, api, signIn, trySignIn } from "../support/http";
import { uniqueEmail } from "../support/db";
import { latestLinkTo, tokenFromLink } from "../support/inbox";

async function newLead() {
  const email = uniqueEmail("zone-lead");
  const res = await api(null, "POST", "/api/signup", { companyName: `Zone Works ${Date.now().toString(36)}`, name: "Zia Zone", email });
  expect(res.status).toBe(202);
  const set = await api(null, "POST", "/api/password/set", { token: tokenFromLink(await latestLinkTo(email)), password: "zone-lead-password" });
  expect(set.status).toBe(200);
  const { session } = await trySignIn(email, "zone-lead-password");
  return session!;
}

describe("the workspace's time zone", () => {
  it("starts in UTC; a lead sets an IANA zone and every session of the workspace reads it", async () => {
    const lead = await newLead();
    expect((await api<{ workspace: { timeZone: string } }>(lead, "GET", "/api/workspace")).body.workspace.timeZone).toBe("UTC");
    const set = await api<{ workspace: { timeZone: string } }>(lead, "PATCH", "/api/workspace", { timeZone: "Europe/Berlin" });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body.workspace.timeZone).toBe("Europe/Berlin");
    const me = await api<{ user: { timeZone: string } }>(lead, "GET", "/api/me");
    expect(me.body.user.timeZone).toBe("Europe/Berlin");
  });

  it("refuses an unknown zone or an extra field with a clear message, and changes nothing", async () => {
    const lead = await newLead();
    const bad = await api<{ error: { message: string; fieldErrors: Record<string, string> } }>(lead, "PATCH", "/api/workspace", { timeZone: "Mars/Olympus_Mons" });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fieldErrors.timeZone).toMatch(/Choose a time zone from the list/);
    expect((await api(lead, "PATCH", "/api/workspace", { timeZone: "UTC", name: "x" })).status).toBe(400);
    expect((await api<{ workspace: { timeZone: string } }>(lead, "GET", "/api/workspace")).body.workspace.timeZone).toBe("UTC");
  });

  it("only a lead changes it", async () => {
    const inspector = await signIn("inspector@vellmoor.example");
    expect((await api(inspector, "PATCH", "/api/workspace", { timeZone: "Europe/Berlin" })).status).toBe(403);
  });
});

describe("the app's icon", () => {
  it("is served without a session, as an ICO and as SVG", async () => {
    const ico = await fetch(`${BASE_URL}/favicon.ico`, { redirect: "manual" });
    expect(ico.status).toBe(200);
    expect(ico.headers.get("content-type")).toMatch(/image\/(x-icon|vnd\.microsoft\.icon)/);
    const svg = await fetch(`${BASE_URL}/icon.svg`, { redirect: "manual" });
    expect(svg.status).toBe(200);
    expect(await svg.text()).toMatch(/^<svg/);
  });
});
