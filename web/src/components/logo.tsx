/** Doublet's mark: two offset, overlapping brackets — two near-copies of one shape. */
export function Logo({ className = 'h-5 w-5' }: { className?: string }) {
  return (
    <svg viewBox="0 0 24 24" className={className} aria-hidden="true" fill="none" strokeWidth="2.2" strokeLinecap="square">
      <path d="M9 4H5v12h4" stroke="currentColor" />
      <path d="M15 8h4v12h-4" stroke="currentColor" opacity="0.55" />
    </svg>
  );
}
