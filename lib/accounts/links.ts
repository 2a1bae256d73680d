import { env } from "@/lib/env";

export function setPasswordLink(token: string): string {
  return `${env().APP_URL.replace(/\/$/, "")}/set-password?token=${encodeURIComponent(token)}`;
}
