import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CLASS_STATUSES, type ClassListQuery } from '@shared/api/snapshots';
import {
  DEFAULT_CLASS_QUERY,
  changeClassFilters,
  readClassFilters,
  toggleClassSort,
  writeClassFilters,
} from '@/features/clone-classes/lib/class-filters';

const read = (search: string) => readClassFilters(new URLSearchParams(search));

/** Any query the server accepts (its schema's domains, written out here). */
const anyQuery: fc.Arbitrary<ClassListQuery> = fc.record(
  {
    sort: fc.constantFrom('size', 'tokens', 'similarity', 'type'),
    order: fc.constantFrom('asc', 'desc'),
    type: fc.constantFrom(1, 2, 3),
    language: fc.string({ minLength: 1, maxLength: 40 }).filter((s) => s.trim() === s && s.length > 0),
    path: fc.string({ minLength: 1, maxLength: 300 }).filter((s) => s.trim() === s && s.length > 0),
    status: fc.constantFrom(...CLASS_STATUSES),
    page: fc.integer({ min: 1, max: 10_000 }),
    pageSize: fc.integer({ min: 1, max: 200 }),
  },
  { requiredKeys: ['sort', 'order', 'page', 'pageSize'] },
) as fc.Arbitrary<ClassListQuery>;

describe('readClassFilters', () => {
  it('reads sort, filters and page from the search parameters, with the server defaults for the rest', () => {
    expect(read('status=drifted&type=3&page=2&path=billing%2F')).toEqual({
      sort: 'tokens',
      order: 'desc',
      status: 'drifted',
      type: 3,
      path: 'billing/',
      page: 2,
      pageSize: 50,
    });
    expect(read('sort=size&order=asc&language=python')).toMatchObject({ sort: 'size', order: 'asc', language: 'python' });
  });

  it('drops only the parameters the shared schema rejects', () => {
    expect(read('status=sideways&type=9&pageSize=5000&page=abc&path=yard')).toEqual({ ...DEFAULT_CLASS_QUERY, path: 'yard' });
    expect(read('sort=colour&status=grown')).toEqual({ ...DEFAULT_CLASS_QUERY, status: 'grown' });
  });

  describe('edge cases', () => {
    it('treats an empty search, empty values and unknown parameters as no filter', () => {
      expect(read('')).toEqual(DEFAULT_CLASS_QUERY);
      expect(read('status=&type=&path=%20%20&utm=x')).toEqual(DEFAULT_CLASS_QUERY);
    });

    it('keeps characters that mean something in a URL inside the path filter', () => {
      const path = 'src/a&b=c?d #e%';
      expect(read(writeClassFilters({ ...DEFAULT_CLASS_QUERY, path }).toString()).path).toBe(path);
    });
  });
});

describe('writeClassFilters', () => {
  it('writes only what differs from the defaults, in a fixed order', () => {
    expect(writeClassFilters(DEFAULT_CLASS_QUERY).toString()).toBe('');
    expect(writeClassFilters({ ...DEFAULT_CLASS_QUERY, page: 3, status: 'new', sort: 'size' }).toString()).toBe('sort=size&status=new&page=3');
  });

  it('round-trips every query the server accepts', () => {
    fc.assert(
      fc.property(anyQuery, (query) => {
        expect(read(writeClassFilters(query).toString())).toEqual({ ...DEFAULT_CLASS_QUERY, ...query });
      }),
      { numRuns: 300 },
    );
  });
});

describe('changeClassFilters', () => {
  it('goes back to page 1 when a filter or the sort changes, and keeps the other filters', () => {
    const on3 = { ...DEFAULT_CLASS_QUERY, status: 'drifted' as const, page: 3 };
    expect(changeClassFilters(on3, { type: 2 })).toEqual({ ...DEFAULT_CLASS_QUERY, status: 'drifted', type: 2, page: 1 });
    expect(changeClassFilters(on3, { page: 4 })).toEqual({ ...on3, page: 4 });
  });

  describe('edge cases', () => {
    it('removes a filter set to undefined or to an empty string', () => {
      const q = { ...DEFAULT_CLASS_QUERY, status: 'new' as const, path: 'yard' };
      const cleared = changeClassFilters(q, { status: undefined, path: '' });
      expect(cleared).toEqual(DEFAULT_CLASS_QUERY);
      expect('status' in cleared).toBe(false);
    });
  });
});

describe('toggleClassSort', () => {
  it('flips the order on the same column and starts another column largest first', () => {
    const bySizeDesc = { ...DEFAULT_CLASS_QUERY, sort: 'size' as const, order: 'desc' as const, page: 2 };
    expect(toggleClassSort(bySizeDesc, 'size')).toMatchObject({ sort: 'size', order: 'asc', page: 1 });
    expect(toggleClassSort({ ...bySizeDesc, order: 'asc' }, 'similarity')).toMatchObject({ sort: 'similarity', order: 'desc' });
  });
});
