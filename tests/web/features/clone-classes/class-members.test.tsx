// @vitest-environment jsdom
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import type { CloneClassDetailDTO, CloneClassMemberDTO } from '@shared/api/snapshots';
import { ClassMembers } from '@/features/clone-classes/components/class-members';

afterEach(cleanup);

// Invented members: three copies of a wagon-weight check in a made-up yard codebase.
let nextFragmentId = 1;
function member(path: string, name: string, changed: boolean, startLine = 10): CloneClassMemberDTO {
  const code = [`function ${name}(wagon) {`, '  return wagon.tare + wagon.load;', '}'].join('\n');
  return { fragmentId: nextFragmentId++, path, name, kind: 'function', startLine, endLine: startLine + 2, tokens: 60, changed, code };
}

function detail(members: CloneClassMemberDTO[], pairs: CloneClassDetailDTO['pairs']): CloneClassDetailDTO {
  return {
    id: 9, snapshotId: 2, size: members.length, tokens: 180, minSimilarity: 0.8, maxSimilarity: 1, cloneType: 3,
    language: 'javascript', status: 'drifted', lineageId: 4, paths: members.map((m) => m.path), repositoryId: 1, snapshotLabel: 'v2',
    waiver: null, waiverEnded: null,
    members, pairs,
  };
}

const THREE = detail(
  [member('yard/a.js', 'grossA', false), member('yard/b.js', 'grossB', true), member('yard/cc.js', 'grossC', false)],
  // a–b and b–c are pairs; a and c are in one class only through b.
  [
    { a: 0, b: 1, similarity: 0.85, type: 3 },
    { a: 1, b: 2, similarity: 0.9, type: 3 },
  ],
);

const sideOf = (side: 'Left' | 'Right') => screen.getByRole('article', { name: new RegExp(`^${side}: `) });

describe('ClassMembers', () => {
  it('opens on the most similar pair, each member with its code, line numbers and changed marker', () => {
    render(<ClassMembers detail={THREE} />);
    expect(sideOf('Left').getAttribute('aria-label')).toBe('Left: yard/b.js');
    expect(sideOf('Right').getAttribute('aria-label')).toBe('Right: yard/cc.js');
    expect(screen.getByRole('status', { name: 'Pair shown' }).textContent).toContain('similarity 0.900');
    expect(within(sideOf('Left')).getByText('changed since last release')).toBeTruthy();
    expect(within(sideOf('Right')).queryByText('changed since last release')).toBeNull();
    expect(within(sideOf('Left')).getByText('yard/b.js:10–12', { exact: false })).toBeTruthy();
    // One number a row, kept out of the accessible text and of selections.
    const gutter = within(sideOf('Right')).getByRole('region').querySelectorAll('pre [aria-hidden="true"]');
    expect([...gutter].map((n) => n.textContent).join(' ')).toBe('10 11 12');
  });

  it('says so when the two chosen members have no pair of their own', () => {
    render(<ClassMembers detail={THREE} />);
    fireEvent.change(screen.getByLabelText('Left'), { target: { value: '0' } });
    expect(sideOf('Left').getAttribute('aria-label')).toBe('Left: yard/a.js');
    expect(screen.getByRole('status', { name: 'Pair shown' }).textContent).toMatch(/No direct pair/);
  });

  it('shows every pair in a matrix, a dash for members joined only through others, and opens the pair a cell names', () => {
    render(<ClassMembers detail={THREE} />);
    const matrix = screen.getByRole('table', { name: 'Similarity of every pair' });
    const cell = (from: string, to: string) => within(matrix).getByRole('button', { name: new RegExp(`^Compare ${from} \\(.*\\) and ${to} \\(`) });
    expect(cell('grossA', 'grossB').textContent).toBe('0.850');
    expect(cell('grossC', 'grossB').textContent).toBe('0.900');
    expect(cell('grossA', 'grossC').textContent).toBe('—');
    expect(cell('grossA', 'grossC').getAttribute('aria-label')).toMatch(/no direct pair$/);
    expect(cell('grossB', 'grossC').getAttribute('aria-pressed')).toBe('true');
    fireEvent.click(cell('grossC', 'grossA'));
    expect(sideOf('Left').getAttribute('aria-label')).toBe('Left: yard/cc.js');
    expect(sideOf('Right').getAttribute('aria-label')).toBe('Right: yard/a.js');
    expect(screen.getByRole('status', { name: 'Pair shown' }).textContent).toMatch(/No direct pair/);
    expect(cell('grossA', 'grossC').getAttribute('aria-pressed')).toBe('true');
    expect(cell('grossB', 'grossC').getAttribute('aria-pressed')).toBe('false');
  });

  describe('edge cases', () => {
    it('swaps the sides when one side picks the member shown on the other', () => {
      render(<ClassMembers detail={THREE} />);
      fireEvent.change(screen.getByLabelText('Right'), { target: { value: '1' } });
      expect(sideOf('Left').getAttribute('aria-label')).toBe('Left: yard/cc.js');
      expect(sideOf('Right').getAttribute('aria-label')).toBe('Right: yard/b.js');
    });

    it('shows two members without a chooser', () => {
      render(<ClassMembers detail={detail([member('a.js', 'f', false), member('b.js', 'g', false)], [{ a: 0, b: 1, similarity: 1, type: 1 }])} />);
      expect(screen.queryByLabelText('Left')).toBeNull();
      expect(screen.queryByRole('table', { name: 'Similarity of every pair' })).toBeNull();
      expect(screen.getAllByRole('article')).toHaveLength(2);
      expect(screen.getByRole('status', { name: 'Pair shown' }).textContent).toContain('type 1');
    });
  });
});
