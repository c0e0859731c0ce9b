import { Button } from '@/components/button';

/** "51–100 of 240" with previous and next. */
export function Pagination({
  page,
  pageSize,
  total,
  onPage,
}: {
  page: number;
  pageSize: number;
  total: number;
  onPage: (page: number) => void;
}) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav aria-label="Pages" className="flex items-center justify-between gap-4 text-sm">
      <span className="font-mono text-xs text-muted tabular-nums">
        {first}–{last} of {total}
      </span>
      <div className="flex items-center gap-2">
        <Button variant="secondary" className="px-2 py-1 text-xs" disabled={page <= 1} onClick={() => onPage(page - 1)}>
          Previous
        </Button>
        <span className="font-mono text-xs tabular-nums">
          {Math.min(page, pages)} / {pages}
        </span>
        <Button variant="secondary" className="px-2 py-1 text-xs" disabled={page >= pages} onClick={() => onPage(page + 1)}>
          Next
        </Button>
      </div>
    </nav>
  );
}
