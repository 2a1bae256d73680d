import { Wordmark } from "@/components/ui/logo";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col items-center justify-center bg-gauge-900 px-4 py-10">
      <div className="mb-6 text-white">
        <Wordmark />
      </div>
      <main className="w-full max-w-sm rounded-xl bg-white p-6 shadow-lg">{children}</main>
      <p className="mt-6 max-w-sm text-center text-xs text-gauge-300">Inspection evidence, grades and lot decisions for a spare-parts QC desk.</p>
    </div>
  );
}
