/** The small "over budget" flag beside a clone ratio. */
export function OverBudgetMarker() {
  return (
    <span className="inline-block rounded-sm border border-danger/40 bg-danger-soft px-1.5 py-0.5 font-mono text-[11px] leading-none text-danger uppercase">
      over budget
    </span>
  );
}
