/** Partproof's mark: a part outline with one cut corner and a check across it. */
export function Logo({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <path d="M5 3h16l6 6v20H5z" fill="#245158" />
      <path d="M21 3v6h6" fill="#7fb8bc" />
      <path d="M10 17l4 4 8-9" fill="none" stroke="#fbbf5c" strokeWidth="3" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="flex items-center gap-2">
      <Logo />
      <span className="text-lg font-semibold tracking-tight">
        Part<span className="text-gauge-500">proof</span>
      </span>
    </span>
  );
}
