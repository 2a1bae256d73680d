import type { Metadata } from "next";
import { SignUpForm } from "@/components/auth/sign-up-form";
import { STARTER_CHOICES } from "@/lib/part-types/starters";

export const metadata: Metadata = { title: "Sign up" };

export default function SignUpPage() {
  return <SignUpForm starters={STARTER_CHOICES} />;
}
