// @vitest-environment jsdom
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { MemoryRouter, useLocation } from 'react-router-dom';
import { afterEach, describe, expect, it } from 'vitest';
import { ClassFilters } from '@/features/clone-classes/components/class-filters';
import { useClassFilters } from '@/features/clone-classes/hooks/use-class-filters';

afterEach(cleanup);

/** The filters bound to the URL as the snapshot page binds them, and the URL's search shown beside. */
function Harness() {
  const [query, setQuery] = useClassFilters();
  const location = useLocation();
  return (
    <>
      <ClassFilters query={query} languages={['javascript', 'python']} onChange={setQuery} />
      <output data-testid="search">{location.search}</output>
    </>
  );
}

function renderAt(url: string) {
  render(
    <MemoryRouter initialEntries={[url]}>
      <Harness />
    </MemoryRouter>,
  );
  return () => screen.getByTestId('search').textContent;
}

const select = (label: string) => screen.getByLabelText(label) as HTMLSelectElement;

describe('ClassFilters bound to the URL', () => {
  it('shows the filters held in the URL', () => {
    renderAt('/snapshots/7?type=3&language=python&status=drifted&path=yard');
    expect(select('Type').value).toBe('3');
    expect(select('Language').value).toBe('python');
    expect(select('Status').value).toBe('drifted');
    expect((screen.getByLabelText('Path contains') as HTMLInputElement).value).toBe('yard');
  });

  it('writes a chosen filter into the URL and goes back to page 1', () => {
    const search = renderAt('/snapshots/7?status=new&page=4');
    fireEvent.change(select('Type'), { target: { value: '2' } });
    expect(search()).toBe('?type=2&status=new');
    fireEvent.change(select('Status'), { target: { value: 'drifted' } });
    expect(search()).toBe('?type=2&status=drifted');
  });

  it('applies the path on submit, not on every keystroke', () => {
    const search = renderAt('/snapshots/7');
    fireEvent.change(screen.getByLabelText('Path contains'), { target: { value: ' billing/ ' } });
    expect(search()).toBe('');
    fireEvent.click(screen.getByRole('button', { name: 'Filter' }));
    expect(search()).toBe('?path=billing%2F');
  });

  describe('edge cases', () => {
    it('clears every filter but keeps the sort', () => {
      const search = renderAt('/snapshots/7?sort=size&type=1&language=python&status=grown&path=x&page=2');
      fireEvent.click(screen.getByRole('button', { name: 'Clear' }));
      expect(search()).toBe('?sort=size');
      expect(select('Type').value).toBe('');
      expect((screen.getByLabelText('Path contains') as HTMLInputElement).value).toBe('');
      expect(screen.queryByRole('button', { name: 'Clear' })).toBeNull();
    });

    it('ignores an invalid status in the URL and still offers a language the snapshot list lacks', () => {
      renderAt('/snapshots/7?status=sideways&language=go');
      expect(select('Status').value).toBe('');
      expect(select('Language').value).toBe('go');
    });
  });
});
