import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { Notice, errorMessage } from '@/components/notice';
import { ApiError } from '@/lib/api-client';
import { formatSimilarity } from '@/lib/format';
import { useFindCopies } from '@/features/find-copies/api/find-copies';
import { CopiesTable } from '@/features/find-copies/components/copies-table';
import { FindCopiesForm } from '@/features/find-copies/components/find-copies-form';

/** /find-copies: paste a function, see every indexed copy of it. */
export function FindCopiesRoute() {
  const search = useFindCopies();
  const fieldError = search.error instanceof ApiError && search.error.field ? { [search.error.field]: search.error.message } : {};
  return (
    <div className="max-w-6xl">
      <PageHeader
        title="Find copies"
        subtitle="Found a bug in one function? Paste it and see every other copy in the latest release of each repository."
      />
      <div className="grid items-start gap-4 xl:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        <Panel title="Pasted code">
          <FindCopiesForm onSubmit={(input) => search.mutate(input)} pending={search.isPending} serverErrors={fieldError} />
        </Panel>
        <Panel
          title="Copies"
          actions={
            search.data ? (
              <span className="font-mono text-xs text-muted">
                {search.data.copies.length} at similarity ≥ {formatSimilarity(search.data.threshold)}
              </span>
            ) : null
          }
        >
          {search.isError && !fieldError.language && !fieldError.text && !fieldError.threshold ? (
            <Notice tone="error">{errorMessage(search.error)}</Notice>
          ) : null}
          {search.data ? (
            <CopiesTable result={search.data} />
          ) : search.isPending ? (
            <p className="text-sm text-muted">Searching…</p>
          ) : (
            <p className="text-sm text-muted">Results appear here.</p>
          )}
        </Panel>
      </div>
    </div>
  );
}
