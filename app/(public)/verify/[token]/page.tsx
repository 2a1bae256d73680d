import type { Metadata } from "next";
import { VerificationView } from "@/components/certificates/verification-view";
import { verifyCertificateToken } from "@/lib/certificates/verification";

export const metadata: Metadata = { title: "Verify a certificate", robots: { index: false, follow: false } };
export const dynamic = "force-dynamic";

/** The QR code's page: signed out, one certificate by its signed token. */
export default async function VerifyTokenPage(props: PageProps<"/verify/[token]">) {
  const { token } = await props.params;
  return <VerificationView answer={await verifyCertificateToken(decodeURIComponent(token))} />;
}
