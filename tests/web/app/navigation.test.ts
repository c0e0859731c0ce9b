import { describe, expect, it } from 'vitest';
import { NAV_ITEMS, navigationFor } from '@/app/navigation';

describe('navigationFor', () => {
  it('hides Admin from everyone but admins and Find copies from viewers', () => {
    expect(navigationFor('admin').map((i) => i.label)).toContain('Admin');
    for (const role of ['lead', 'engineer', 'viewer'] as const) {
      expect(navigationFor(role).map((i) => i.label)).not.toContain('Admin');
    }
    expect(navigationFor('viewer').map((i) => i.label)).not.toContain('Find copies');
    expect(navigationFor('engineer').map((i) => i.label)).toContain('Find copies');
  });

  describe('edge cases', () => {
    it('shows admins every item, in order', () => {
      expect(navigationFor('admin')).toEqual(NAV_ITEMS);
    });

    it('always shows the overview', () => {
      for (const role of ['admin', 'lead', 'engineer', 'viewer'] as const) expect(navigationFor(role)[0].to).toBe('/');
    });
  });
});
