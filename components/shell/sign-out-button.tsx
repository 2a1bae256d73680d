"use client";

import { signOut } from "next-auth/react";

export function SignOutButton() {
  return (
    <button type="button" className="btn w-full border border-gauge-600 text-gauge-100 hover:bg-gauge-800" onClick={() => signOut({ callbackUrl: "/sign-in" })}>
      Sign out
    </button>
  );
}
