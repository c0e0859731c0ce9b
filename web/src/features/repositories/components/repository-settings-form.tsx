import { useState, type FormEvent } from 'react';
import { updateRepositorySchema, type RepositoryDTO } from '../../../../../shared/api/repositories';
import { INDEX_MIN_THRESHOLD } from '../../../../../shared/constants';
import { Button } from '../../../components/button';
import { TextField } from '../../../components/field';
import { Notice, errorMessage } from '../../../components/notice';
import { TextAreaField } from '../../../components/textarea-field';
import { ApiError } from '../../../lib/api-client';
import { nonEmptyLines, optionalNumber, validate, type FieldErrors } from '../../../lib/form';
import { useUpdateRepository } from '../api/update-repository';

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
    const result = validate(updateRepositorySchema, {
      threshold: optionalNumber(form.get('threshold')),
      minTokens: optionalNumber(form.get('minTokens')),
      shingleSize: optionalNumber(form.get('shingleSize')),
      ignore: nonEmptyLines(form.get('ignore')),
      cloneBudget: optionalNumber(form.get('cloneBudget')) ?? null,
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
      <div className="grid grid-cols-3 gap-2">
        <TextField
          label="Threshold"
          name="threshold"
          type="number"
          step="0.01"
          min={INDEX_MIN_THRESHOLD}
          max={1}
          defaultValue={repository.threshold}
          error={errors.threshold}
        />
        <TextField label="Min tokens" name="minTokens" type="number" min={5} defaultValue={repository.minTokens} error={errors.minTokens} />
        <TextField label="Shingle" name="shingleSize" type="number" min={1} max={10} defaultValue={repository.shingleSize} error={errors.shingleSize} />
      </div>
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
      <TextField
        label="Clone budget"
        name="cloneBudget"
        type="number"
        step="0.005"
        min={0}
        max={1}
        placeholder="none"
        defaultValue={repository.cloneBudget ?? ''}
        hint="A share of tokens, 0.05 = 5 %. Empty: no budget."
        error={errors.cloneBudget}
      />
      <Button type="submit" disabled={update.isPending}>
        Save settings
      </Button>
    </form>
  );
}
