import { Wordmark } from "@/components/ui/logo";

/** Signed-out public pages (certificate verification, evidence links): no navigation, nothing of any workspace. */
export default function PublicLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col items-center bg-gauge-100 px-4 py-10">
      <div className="mb-6 text-gauge-900">
        <Wordmark />
      </div>
      <main className="w-full max-w-xl rounded-xl bg-white p-6 shadow-sm">{children}</main>
    </div>
  );
}
