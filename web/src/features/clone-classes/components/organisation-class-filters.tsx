import { useState, type FormEvent } from 'react';
import type { ClassRepositoryDTO, ClassScope, OrganisationClassQuery } from '@shared/api/clone-classes';
import { CLASS_STATUSES, type ClassStatus } from '@shared/api/snapshots';
import { Button } from '@/components/button';
import { SelectField, TextField } from '@/components/field';
import type { OrganisationClassChange } from '@/features/clone-classes/lib/organisation-class-filters';

/** The text filters as typed, before they are applied. */
interface Draft {
  minMembers: string;
  minTokens: string;
  path: string;
  name: string;
}

const draftOf = (query: OrganisationClassQuery): Draft => ({
  minMembers: query.minMembers === undefined ? '' : String(query.minMembers),
  minTokens: query.minTokens === undefined ? '' : String(query.minTokens),
  path: query.path ?? '',
  name: query.name ?? '',
});

/** A whole number typed in a field, or undefined when it is empty or not a number. */
const wholeNumber = (text: string) => (/^\d{1,9}$/.test(text.trim()) ? Number(text.trim()) : undefined);

/**
 * Every filter of the organisation's class list. Selects apply at once; the numbers and texts apply
 * on Enter or "Apply", so the URL does not change on every keystroke.
 */
export function OrganisationClassFilters({
  query,
  repositories,
  languages,
  waivedCount,
  onChange,
}: {
  query: OrganisationClassQuery;
  repositories: ClassRepositoryDTO[];
  languages: string[];
  /** how many of the classes the other filters match are waived (unknown while loading) */
  waivedCount?: number;
  onChange: (change: OrganisationClassChange) => void;
}) {
  const [draft, setDraft] = useState(() => draftOf(query));
  const [shown, setShown] = useState(query);
  // The URL is the truth: when it changes underneath (Back, a link), the fields follow.
  if (shown !== query) {
    setShown(query);
    setDraft(draftOf(query));
  }
  const set = (key: keyof Draft) => (e: { target: { value: string } }) => setDraft({ ...draft, [key]: e.target.value });
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    onChange({
      minMembers: wholeNumber(draft.minMembers),
      minTokens: wholeNumber(draft.minTokens),
      path: draft.path.trim() || undefined,
      name: draft.name.trim() || undefined,
    });
  };
  const languageOptions = query.language && !languages.includes(query.language) ? [...languages, query.language] : languages;
  const filtered = (['repository', 'scope', 'status', 'waived', 'type', 'language', 'minMembers', 'minTokens', 'path', 'name'] as const).some((k) => query[k] !== undefined);

  return (
    <form onSubmit={submit} role="search" aria-label="Filter clone classes" className="space-y-2">
      <div className="grid items-end gap-2 sm:grid-cols-3 lg:grid-cols-6">
        <SelectField label="Repository" value={query.repository ?? ''} onChange={(e) => onChange({ repository: e.target.value ? Number(e.target.value) : undefined })}>
          <option value="">all</option>
          {repositories.map((r) => (
            <option key={r.id} value={r.id}>
              {r.name}
            </option>
          ))}
          {query.repository !== undefined && !repositories.some((r) => r.id === query.repository) ? <option value={query.repository}>#{query.repository}</option> : null}
        </SelectField>
        <SelectField label="Where" value={query.scope ?? ''} onChange={(e) => onChange({ scope: (e.target.value || undefined) as ClassScope | undefined })}>
          <option value="">anywhere</option>
          <option value="across">across repositories</option>
          <option value="within">within one repository</option>
        </SelectField>
        <SelectField label="Status" value={query.status ?? ''} onChange={(e) => onChange({ status: (e.target.value || undefined) as ClassStatus | undefined })}>
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
          onChange={(e) => onChange({ waived: (e.target.value || undefined) as OrganisationClassQuery['waived'] })}
        >
          <option value="">included</option>
          <option value="only">only waived</option>
          <option value="exclude">left out</option>
        </SelectField>
        <SelectField label="Type" value={query.type ?? ''} onChange={(e) => onChange({ type: e.target.value ? Number(e.target.value) : undefined })}>
          <option value="">any</option>
          <option value="1">1 · identical</option>
          <option value="2">2 · renamed</option>
          <option value="3">3 · similar</option>
        </SelectField>
        <SelectField label="Language" value={query.language ?? ''} onChange={(e) => onChange({ language: e.target.value || undefined })}>
          <option value="">any</option>
          {languageOptions.map((language) => (
            <option key={language} value={language}>
              {language}
            </option>
          ))}
        </SelectField>
      </div>
      <div className="grid items-end gap-2 sm:grid-cols-[7rem_7rem_1fr_1fr_auto]">
        <TextField label="Min members" inputMode="numeric" value={draft.minMembers} onChange={set('minMembers')} placeholder="any" className="font-mono" />
        <TextField label="Min tokens" inputMode="numeric" value={draft.minTokens} onChange={set('minTokens')} placeholder="any" className="font-mono" />
        <TextField label="Path contains" value={draft.path} onChange={set('path')} placeholder="billing/" className="font-mono" />
        <TextField label="Function name contains" value={draft.name} onChange={set('name')} placeholder="price" className="font-mono" />
        <div className="flex gap-2">
          <Button type="submit" variant="secondary">
            Apply
          </Button>
          {filtered ? (
            <Button
              variant="secondary"
              onClick={() =>
                onChange({
                  repository: undefined,
                  scope: undefined,
                  status: undefined,
                  waived: undefined,
                  type: undefined,
                  language: undefined,
                  minMembers: undefined,
                  minTokens: undefined,
                  path: undefined,
                  name: undefined,
                })
              }
            >
              Clear
            </Button>
          ) : null}
        </div>
      </div>
    </form>
  );
}
