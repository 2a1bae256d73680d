import { env } from "@/lib/env";

export function setPasswordLink(token: string): string {
  return `${env().APP_URL.replace(/\/$/, "")}/set-password?token=${encodeURIComponent(token)}`;
}

export function signInLink(): string {
  return `${env().APP_URL.replace(/\/$/, "")}/sign-in`;
}

export function forgotPasswordLink(): string {
  return `${env().APP_URL.replace(/\/$/, "")}/forgot-password`;
}
