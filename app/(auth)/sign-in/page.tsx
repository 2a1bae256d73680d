import type { Metadata } from "next";
import { SignInForm } from "@/components/auth/sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage(props: PageProps<"/sign-in">) {
  const params = await props.searchParams;
  const callbackUrl = typeof params.callbackUrl === "string" ? params.callbackUrl : undefined;
  const notice = params.passwordSet === "1" ? "Your password is set. Sign in with it now." : undefined;
  return <SignInForm callbackUrl={callbackUrl} notice={notice} />;
}
