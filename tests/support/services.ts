/**
 * Takes a test service down and brings it back (scripts/lib/test-control.ts): the object store,
 * the mail inbox, PostgreSQL, the worker (killed with SIGKILL). Only in `npm test` runs.
 */
export type ServiceName = "s3" | "mail" | "postgres" | "worker";
type Action = "stop" | "start" | "kill";

export async function serviceControl(service: ServiceName, action: Action): Promise<void> {
  const url = process.env.TEST_CONTROL_URL;
  if (!url) throw new Error("TEST_CONTROL_URL is not set; run the integration tests through `npm run test:integration`.");
  const res = await fetch(`${url}/${service}/${action}`, { method: "POST" });
  if (res.status !== 204) throw new Error(`${service} ${action} failed: ${res.status} ${await res.text()}`);
}
