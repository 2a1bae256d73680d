import type { Metadata } from "next";
import { SetPasswordForm } from "@/components/auth/set-password-form";

export const metadata: Metadata = { title: "Set password" };

export default async function SetPasswordPage(props: PageProps<"/set-password">) {
  const { token } = await props.searchParams;
  return <SetPasswordForm token={typeof token === "string" ? token : ""} />;
}
