import { useState, type FormEvent } from 'react';
import { SNIPPET_LANGUAGES, findCopiesSchema, type FindCopiesInput } from '@shared/api/find-copies';
import { DEFAULT_REPOSITORY_SETTINGS, INDEX_MIN_THRESHOLD } from '@shared/constants';
import { Button } from '@/components/button';
import { SelectField, TextField } from '@/components/field';
import { TextAreaField } from '@/components/textarea-field';
import { optionalNumber, validate, type FieldErrors } from '@/lib/form';

const LANGUAGE_NAMES: Record<(typeof SNIPPET_LANGUAGES)[number], string> = {
  javascript: 'JavaScript',
  typescript: 'TypeScript',
  python: 'Python',
  java: 'Java',
  go: 'Go',
  csharp: 'C#',
  c: 'C',
  cpp: 'C++',
};

/**
 * Language, the pasted code and a threshold, checked with the same schema the server uses;
 * calls onSubmit with valid input only.
 */
export function FindCopiesForm({
  onSubmit,
  pending = false,
  serverErrors = {},
}: {
  onSubmit: (input: FindCopiesInput) => void;
  pending?: boolean;
  serverErrors?: FieldErrors;
}) {
  const [errors, setErrors] = useState<FieldErrors>({});
  const shown = { ...serverErrors, ...errors };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const result = validate(findCopiesSchema, {
      language: form.get('language'),
      text: form.get('text'),
      threshold: optionalNumber(form.get('threshold')),
    });
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    onSubmit(result.data);
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-3">
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-[12rem_8rem]">
        <SelectField label="Language" name="language" defaultValue="javascript" error={shown.language}>
          {SNIPPET_LANGUAGES.map((language) => (
            <option key={language} value={language}>
              {LANGUAGE_NAMES[language]}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Threshold"
          name="threshold"
          type="number"
          step="0.01"
          min={INDEX_MIN_THRESHOLD}
          max={1}
          defaultValue={DEFAULT_REPOSITORY_SETTINGS.threshold}
          error={shown.threshold}
        />
      </div>
      <TextAreaField
        label="Code"
        name="text"
        mono
        rows={14}
        placeholder="Paste a function, or a few"
        hint="Searched in the latest snapshot of every repository; the code is not stored."
        error={shown.text}
        wrap="off"
        className="resize-y"
      />
      <Button type="submit" disabled={pending}>
        {pending ? 'Searching…' : 'Find copies'}
      </Button>
    </form>
  );
}
