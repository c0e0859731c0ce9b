import { useState, type FormEvent } from 'react';
import { updateRepositorySchema, type RepositoryDTO } from '@shared/api/repositories';
import { Button } from '@/components/button';
import { Notice, errorMessage } from '@/components/notice';
import { TextAreaField } from '@/components/textarea-field';
import { ApiError } from '@/lib/api-client';
import { nonEmptyLines, validate, type FieldErrors } from '@/lib/form';
import { useUpdateRepository } from '@/features/repositories/api/update-repository';
import { CloneBudgetField, MatchingSettingsFields, readMatchingSettings } from './matching-settings-fields';

/**
 * Matching settings, ignore patterns and the clone budget of a repository (leads). Settings apply
 * to the next loaded snapshot; an empty budget removes it.
 */
export function RepositorySettingsForm({ repository }: { repository: RepositoryDTO }) {
  const update = useUpdateRepository();
  const [errors, setErrors] = useState<FieldErrors>({});

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const settings = readMatchingSettings(form);
    const result = validate(updateRepositorySchema, {
      ...settings,
      ignore: nonEmptyLines(form.get('ignore')),
      cloneBudget: settings.cloneBudget ?? null,
    });
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    update.mutate(
      { id: repository.id, ...result.data },
      {
        onError: (error) => {
          if (error instanceof ApiError && error.field) setErrors({ [error.field]: error.message });
        },
      },
    );
  };

  return (
    // Keyed by the saved values so the fields show what the server kept after a save.
    <form key={JSON.stringify(repository)} onSubmit={submit} noValidate className="space-y-3">
      {update.isSuccess ? <Notice>Settings saved. They apply from the next loaded snapshot.</Notice> : null}
      {update.isError && !(update.error instanceof ApiError && update.error.field) ? (
        <Notice tone="error">{errorMessage(update.error)}</Notice>
      ) : null}
      <MatchingSettingsFields values={repository} errors={errors} />
      <TextAreaField
        label="Ignore"
        name="ignore"
        mono
        rows={4}
        defaultValue={repository.ignore.join('\n')}
        placeholder={'vendor/\n**/*.generated.ts'}
        hint="One gitignore pattern a line."
        error={errors.ignore ?? Object.entries(errors).find(([key]) => key.startsWith('ignore.'))?.[1]}
      />
      <CloneBudgetField value={repository.cloneBudget} error={errors.cloneBudget} />
      <Button type="submit" disabled={update.isPending}>
        Save settings
      </Button>
    </form>
  );
}
