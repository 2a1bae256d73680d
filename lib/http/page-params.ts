import "server-only";
import { notFound } from "next/navigation";
import { isUuid } from "@/lib/validation";

/** An id from a page URL, or the not-found page (a malformed id is treated like a missing one). */
export function pageIdOrNotFound(raw: string | undefined): string {
  if (!raw || !isUuid(raw)) notFound();
  return raw.toLowerCase();
}
