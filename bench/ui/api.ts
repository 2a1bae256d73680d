/**
 * The UI benchmark's calls to the running app, as the browser makes them: sign-in (next-auth
 * credentials), photo upload (intent → PUT to the presigned URL → finalise; the worker makes
 * the preview), the region set save (PUT with the version it starts from) and the release of
 * the unit at the end.
 */
import { parseRegionSet, type RegionSetPayload } from "@/lib/geometry/validate";
import { canonicalRegions, PHOTO, UI_BENCH_DEFECTS } from "./scene";

export const LOOPBACK = /^http:\/\/(127\.0\.0\.1|localhost)(:\d+)?(\/|$)/;

export type Session = { base: string; cookies: { name: string; value: string }[] };

const header = (s: Session) => ({ cookie: s.cookies.map((c) => `${c.name}=${c.value}`).join("; ") });

async function failure(what: string, res: Response): Promise<Error> {
  const text = await res.text();
  let message = text.slice(0, 400);
  try {
    message = (JSON.parse(text) as { error?: { message?: string } }).error?.message ?? message;
  } catch {
    // not JSON: keep the text
  }
  return new Error(`${what} answered ${res.status}: ${message}`);
}

export async function signIn(base: string, email: string, password: string): Promise<Session> {
  const csrfRes = await fetch(`${base}/api/auth/csrf`);
  const jar = new Map<string, string>();
  const keep = (res: Response) =>
    res.headers.getSetCookie().forEach((c) => {
      const [pair] = c.split(";");
      const at = pair.indexOf("=");
      jar.set(pair.slice(0, at), pair.slice(at + 1));
    });
  keep(csrfRes);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const res = await fetch(`${base}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: [...jar].map(([k, v]) => `${k}=${v}`).join("; ") },
    body: new URLSearchParams({ csrfToken, email, password, json: "true" }),
  });
  keep(res);
  if (![...jar.keys()].some((k) => k.includes("session-token"))) throw new Error(`Sign-in as ${email} failed (status ${res.status}); is this the demo database with its demo passwords?`);
  return { base, cookies: [...jar].map(([name, value]) => ({ name, value })) };
}

type PhotoDto = { id: string; status: string; width: number | null; height: number | null; preview: { width: number; height: number } | null };

/** Uploads the JPEG to the unit's front view and waits until the worker has made the preview. */
export async function uploadPhoto(s: Session, unitId: string, bytes: Buffer): Promise<PhotoDto> {
  const json = { ...header(s), "content-type": "application/json" };
  const intent = await fetch(`${s.base}/api/units/${unitId}/photos/uploads`, {
    method: "POST",
    headers: json,
    body: JSON.stringify({ viewKey: "front", fileName: "ui-bench-12mp.jpg", contentType: "image/jpeg", bytes: bytes.length }),
  });
  if (intent.status !== 201) throw await failure("Upload intent", intent);
  const { ticket, upload } = (await intent.json()) as { ticket: string; upload: { url: string; headers: Record<string, string> } };
  if (!LOOPBACK.test(upload.url)) throw new Error(`The store's upload URL is not on this machine (${new URL(upload.url).host}); the UI benchmark only talks to loopback addresses.`);
  const put = await fetch(upload.url, { method: "PUT", headers: upload.headers, body: new Uint8Array(bytes) });
  if (put.status !== 200) throw await failure("PUT to the object store", put);
  const done = await fetch(`${s.base}/api/units/${unitId}/photos`, { method: "POST", headers: json, body: JSON.stringify({ ticket }) });
  if (![200, 201, 202].includes(done.status)) throw await failure("Finalising the upload", done);
  let photo = ((await done.json()) as { photo: PhotoDto }).photo;
  const deadline = Date.now() + 60_000;
  while (photo.status !== "ready") {
    if (photo.status === "failed" || Date.now() > deadline) throw new Error(`The photo did not become ready (status ${photo.status}); is the worker running (it starts with \`npm start\`)?`);
    await new Promise((r) => setTimeout(r, 500));
    const res = await fetch(`${s.base}/api/photos/${photo.id}`, { headers: header(s) });
    if (!res.ok) throw await failure("Reading the photo", res);
    photo = ((await res.json()) as { photo: PhotoDto }).photo;
  }
  return photo;
}

export async function getPhoto(s: Session, photoId: string): Promise<PhotoDto> {
  const res = await fetch(`${s.base}/api/photos/${photoId}`, { headers: header(s) });
  if (!res.ok) throw await failure("Reading the photo", res);
  return ((await res.json()) as { photo: PhotoDto }).photo;
}

/**
 * Makes the photo's stored region set exactly `wanted`: nothing is written when it already is
 * (so reruns add no versions), else one save on top of the current version. The set is checked
 * with the app's own validation first, so a broken generator says what is wrong.
 */
export async function ensureRegions(s: Session, photoId: string, wanted: RegionSetPayload): Promise<{ version: number; saved: boolean }> {
  const local = parseRegionSet(wanted, { ...PHOTO, allowedDefects: UI_BENCH_DEFECTS.map((d) => d.key) });
  if (!local.ok) throw new Error(`The generated regions are not valid: ${local.messages.slice(0, 3).join(" ")}`);
  const url = `${s.base}/api/photos/${photoId}/regions`;
  const current = await fetch(url, { headers: header(s) });
  if (!current.ok) throw await failure("Reading the regions", current);
  const set = (await current.json()) as { version: number; regions: RegionSetPayload };
  if (canonicalRegions(set.regions) === canonicalRegions(local.value)) return { version: set.version, saved: false };
  const res = await fetch(url, { method: "PUT", headers: { ...header(s), "content-type": "application/json" }, body: JSON.stringify({ baseVersion: set.version, regions: wanted }) });
  if (!res.ok) throw await failure("Saving the regions", res);
  return { version: ((await res.json()) as { version: number }).version, saved: true };
}

/** Gives the unit back to the queue, as the Bench's release does (it is due last, in 2099). */
export async function releaseUnit(s: Session, unitId: string): Promise<void> {
  const res = await fetch(`${s.base}/api/units/${unitId}/lease`, { method: "DELETE", headers: header(s) });
  if (!res.ok) throw await failure("Releasing the unit", res);
}
