import { useState, type FormEvent } from 'react';
import { createApiTokenSchema, type CreatedApiTokenDTO } from '@shared/api/tokens';
import { Button } from '@/components/button';
import { SelectField, TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { ApiError } from '@/lib/api-client';
import { validate, type FieldErrors } from '@/lib/form';
import { useCreateApiToken } from '@/features/api-tokens/api/create-api-token';

/** A repository the form offers, and whether the list is still loading or failed. */
export interface RepositoryChoices {
  repositories: { id: number; name: string }[] | undefined;
  isPending: boolean;
  error: unknown;
}

/** Name, repository and an optional expiry day; hands the created token (with its secret) to onCreated. */
export function CreateApiTokenForm({ repositories, onCreated }: { repositories: RepositoryChoices; onCreated: (created: CreatedApiTokenDTO) => void }) {
  const create = useCreateApiToken();
  const [errors, setErrors] = useState<FieldErrors>({});

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const formElement = event.currentTarget;
    const form = new FormData(formElement);
    const day = String(form.get('expiresOn') ?? '');
    const result = validate(createApiTokenSchema, {
      name: form.get('name'),
      repositoryId: Number(form.get('repositoryId')),
      // An expiry day means the token stops at the start of that day, UTC.
      expiresAt: day ? `${day}T00:00:00Z` : undefined,
    });
    if (!result.ok) {
      const { expiresAt, ...rest } = result.errors;
      return setErrors(expiresAt ? { ...rest, expiresOn: expiresAt } : rest);
    }
    setErrors({});
    create.mutate(result.data, {
      onSuccess: (created) => {
        formElement.reset();
        onCreated(created);
      },
      onError: (error) => {
        if (error instanceof ApiError && error.field) setErrors({ [error.field === 'expiresAt' ? 'expiresOn' : error.field]: error.message });
      },
    });
  };

  const choices = repositories.repositories ?? [];
  return (
    <form onSubmit={submit} noValidate className="space-y-3">
      {create.isError && !(create.error instanceof ApiError && create.error.field) ? <Notice tone="error">{errorMessage(create.error)}</Notice> : null}
      {repositories.error ? <Notice tone="error">{errorMessage(repositories.error)}</Notice> : null}
      <TextField label="Name" name="name" autoComplete="off" placeholder="e.g. Nightly build" error={errors.name} />
      <SelectField label="Repository" name="repositoryId" error={errors.repositoryId} defaultValue="">
        <option value="" disabled>
          {repositories.isPending ? 'Loading repositories…' : choices.length ? 'Choose a repository' : 'No repositories yet'}
        </option>
        {choices.map((repository) => (
          <option key={repository.id} value={repository.id}>
            {repository.name}
          </option>
        ))}
      </SelectField>
      <TextField
        label="Expires on (optional)"
        name="expiresOn"
        type="date"
        hint="Stops working at 00:00 UTC that day. Leave empty for no expiry."
        error={errors.expiresOn}
      />
      <Button type="submit" disabled={create.isPending || choices.length === 0}>
        Create token
      </Button>
    </form>
  );
}
