import type { Metadata } from "next";
import { CodeForm, VerificationView } from "@/components/certificates/verification-view";
import { verifyCertificateCode } from "@/lib/certificates/verification";

export const metadata: Metadata = { title: "Verify a certificate", robots: { index: false, follow: false } };

/** Typing the short code printed under the QR code: signed out. */
export default async function VerifyCodePage(props: PageProps<"/verify">) {
  const search = await props.searchParams;
  const code = typeof search.code === "string" ? search.code : undefined;
  return (
    <div className="space-y-6">
      <CodeForm code={code} />
      {code !== undefined && <VerificationView answer={await verifyCertificateCode(code)} />}
    </div>
  );
}
