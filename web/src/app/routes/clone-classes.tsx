import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { useOrganisationClasses } from '@/features/clone-classes/api/get-organisation-classes';
import { OrganisationClassFilters } from '@/features/clone-classes/components/organisation-class-filters';
import { OrganisationClassTable } from '@/features/clone-classes/components/organisation-class-table';
import { Pagination } from '@/features/clone-classes/components/pagination';
import { useOrganisationClassFilters } from '@/features/clone-classes/hooks/use-organisation-class-filters';
import { toggleOrganisationSort } from '@/features/clone-classes/lib/organisation-class-filters';

/** /clone-classes: every class of the latest release of every repository, and those that span repositories, filtered in the URL. */
export function CloneClassesRoute() {
  const [query, setQuery] = useOrganisationClassFilters();
  const classes = useOrganisationClasses(query);
  const page = classes.data;
  return (
    <div className="max-w-[90rem] space-y-4">
      <PageHeader
        title="Clone classes"
        subtitle="Groups of near-identical functions in the latest release of every repository, and the groups whose copies span repositories."
      />
      <Panel>
        <div className="space-y-3">
          <OrganisationClassFilters
            query={query}
            repositories={page?.repositories ?? []}
            languages={page?.languages ?? []}
            waivedCount={page?.waivedCount}
            onChange={setQuery}
          />
          {page ? (
            <>
              {page.classes.length === 0 ? (
                <p className="py-4 text-sm text-muted">No clone class matches these filters.</p>
              ) : (
                <div className={classes.isPlaceholderData ? 'opacity-60' : undefined}>
                  <OrganisationClassTable classes={page.classes} query={query} onSort={(column) => setQuery(toggleOrganisationSort(query, column))} />
                </div>
              )}
              <Pagination page={query.page} pageSize={query.pageSize} total={page.total} onPage={(p) => setQuery({ page: p })} />
            </>
          ) : (
            <QueryState query={classes} what="clone classes" />
          )}
        </div>
      </Panel>
    </div>
  );
}
