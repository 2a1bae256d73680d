import Link from "next/link";

export default function NotFound() {
  return (
    <div className="mx-auto mt-24 max-w-md space-y-3 px-4 text-center">
      <p className="text-sm font-medium uppercase tracking-wide text-gauge-500">404</p>
      <h1 className="page-title">Not found</h1>
      <p className="text-gauge-700">There is nothing here, or it belongs to another workspace.</p>
      <Link href="/" className="btn-primary">
        Back to Partproof
      </Link>
    </div>
  );
}
