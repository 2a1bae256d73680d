/**
 * An outgoing e-mail's delivery state in words, the same on the lot page, the supplier page and
 * the Outbox: queued (and, once tried, retrying with the server's last answer), sent (after how
 * many attempts when it took more than one), or failed with the reason. Pure, browser-safe.
 */
export type DeliveryState = { status: "sent" | "queued" | "failed"; attempts: number; error: string | null };

export function deliveryText({ status, attempts, error }: DeliveryState): string {
  const retried = attempts > 1 ? `, after ${attempts} attempts` : "";
  if (status === "sent") return `sent${retried}`;
  if (status === "queued") return attempts > 0 ? `queued, retrying (${attempts} ${attempts === 1 ? "attempt" : "attempts"} so far${error ? `: ${error}` : ""})` : "queued";
  return `failed${retried}${error ? `: ${error}` : ""}`;
}
