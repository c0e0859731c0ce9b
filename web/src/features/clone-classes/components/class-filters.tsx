import { useState, type FormEvent } from 'react';
import { CLASS_STATUSES, type ClassListQuery, type ClassStatus } from '@shared/api/snapshots';
import { Button } from '@/components/button';
import { SelectField, TextField } from '@/components/field';
import type { ClassFilterChange } from '@/features/clone-classes/lib/class-filters';

/**
 * Type, language, status, waived and path filters of the class list. Selects apply at once; the path
 * applies on Enter or "Filter", so the URL does not change on every keystroke.
 */
export function ClassFilters({
  query,
  languages,
  waivedCount,
  onChange,
}: {
  query: ClassListQuery;
  languages: string[];
  /** how many of the classes the other filters match are waived (unknown while loading) */
  waivedCount?: number;
  onChange: (change: ClassFilterChange) => void;
}) {
  const [path, setPath] = useState(query.path ?? '');
  const [shownPath, setShownPath] = useState(query.path);
  // The URL is the truth: when it changes underneath (Back, a status tile), the text follows.
  if (shownPath !== query.path) {
    setShownPath(query.path);
    setPath(query.path ?? '');
  }
  const options = query.language && !languages.includes(query.language) ? [...languages, query.language] : languages;
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    onChange({ path: path.trim() || undefined });
  };
  const filtered = query.type !== undefined || query.language !== undefined || query.status !== undefined || query.waived !== undefined || query.path !== undefined;

  return (
    <form onSubmit={submit} role="search" aria-label="Filter clone classes" className="grid items-end gap-2 sm:grid-cols-[7rem_9rem_9rem_9rem_1fr_auto]">
      <SelectField
        label="Type"
        value={query.type ?? ''}
        onChange={(e) => onChange({ type: e.target.value ? Number(e.target.value) : undefined })}
      >
        <option value="">any</option>
        <option value="1">1 · identical</option>
        <option value="2">2 · renamed</option>
        <option value="3">3 · similar</option>
      </SelectField>
      <SelectField label="Language" value={query.language ?? ''} onChange={(e) => onChange({ language: e.target.value || undefined })}>
        <option value="">any</option>
        {options.map((language) => (
          <option key={language} value={language}>
            {language}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Status"
        value={query.status ?? ''}
        onChange={(e) => onChange({ status: (e.target.value || undefined) as ClassStatus | undefined })}
      >
        <option value="">any</option>
        {CLASS_STATUSES.map((status) => (
          <option key={status} value={status}>
            {status}
          </option>
        ))}
      </SelectField>
      <SelectField
        label={waivedCount === undefined ? 'Waived' : `Waived (${waivedCount})`}
        value={query.waived ?? ''}
        onChange={(e) => onChange({ waived: (e.target.value || undefined) as ClassListQuery['waived'] })}
      >
        <option value="">included</option>
        <option value="only">only waived</option>
        <option value="exclude">left out</option>
      </SelectField>
      <TextField label="Path contains" value={path} onChange={(e) => setPath(e.target.value)} placeholder="billing/" className="font-mono" />
      <div className="flex gap-2">
        <Button type="submit" variant="secondary">
          Filter
        </Button>
        {filtered ? (
          <Button
            variant="secondary"
            onClick={() => onChange({ type: undefined, language: undefined, status: undefined, waived: undefined, path: undefined })}
          >
            Clear
          </Button>
        ) : null}
      </div>
    </form>
  );
}
