import { describe, expect, it } from 'vitest';
import { organisationClassFilters, toggleOrganisationSort } from '@/features/clone-classes/lib/organisation-class-filters';

const { read, write, change, defaults } = organisationClassFilters;

describe('the organisation class list query in the URL', () => {
  it('reads every filter, and drops only the parameters the schema refuses', () => {
    const query = read(new URLSearchParams('repository=7&scope=across&minMembers=1&minTokens=80&path=charges/&name=brake&status=sideways&page=2'));
    expect(query).toEqual({ ...defaults, repository: 7, scope: 'across', minTokens: 80, path: 'charges/', name: 'brake', page: 2 });
  });

  it('writes only what differs from the defaults, in a fixed order, and reads it back the same', () => {
    const query = { ...defaults, name: 'brake', scope: 'across' as const, repository: 3 };
    expect(write(query).toString()).toBe('repository=3&scope=across&name=brake');
    expect(read(write(query))).toEqual(query);
  });

  it('goes back to page 1 on any change but the page, and forgets emptied filters', () => {
    const onPage3 = { ...defaults, page: 3, path: 'yard/' };
    expect(change(onPage3, { page: 4 }).page).toBe(4);
    const next = change(onPage3, { path: undefined, minMembers: 3 });
    expect([next.page, next.path, next.minMembers]).toEqual([1, undefined, 3]);
  });

  it('flips the order on the same column; names start from A, figures from the largest', () => {
    expect(toggleOrganisationSort({ ...defaults, sort: 'size', order: 'desc' }, 'size').order).toBe('asc');
    expect(toggleOrganisationSort(defaults, 'repository')).toMatchObject({ sort: 'repository', order: 'asc' });
    expect(toggleOrganisationSort(defaults, 'similarity')).toMatchObject({ sort: 'similarity', order: 'desc' });
  });
});
