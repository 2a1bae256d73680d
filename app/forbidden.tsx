import Link from "next/link";

export default function Forbidden() {
  return (
    <div className="mx-auto mt-24 max-w-md space-y-3 px-4 text-center" data-testid="forbidden">
      <p className="text-sm font-medium uppercase tracking-wide text-gauge-500">403</p>
      <h1 className="page-title">Not for your role</h1>
      <p className="text-gauge-700">Your account does not have the role this screen needs. Ask your QC lead if you should have it.</p>
      <Link href="/" className="btn-primary">
        Back to your screens
      </Link>
    </div>
  );
}
