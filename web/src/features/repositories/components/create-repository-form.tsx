import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { createRepositorySchema } from '@shared/api/repositories';
import { DEFAULT_REPOSITORY_SETTINGS } from '@shared/constants';
import { Button } from '@/components/button';
import { TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { ApiError } from '@/lib/api-client';
import { validate, type FieldErrors } from '@/lib/form';
import { useCreateRepository } from '@/features/repositories/api/create-repository';
import { CloneBudgetField, MatchingSettingsFields, readMatchingSettings } from './matching-settings-fields';

/** Name, matching settings and an optional clone budget; opens the new repository on success. */
export function CreateRepositoryForm() {
  const create = useCreateRepository();
  const navigate = useNavigate();
  const [errors, setErrors] = useState<FieldErrors>({});

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const result = validate(createRepositorySchema, {
      name: form.get('name'),
      ...readMatchingSettings(form),
    });
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    create.mutate(result.data, {
      onSuccess: (repository) => navigate(`/repositories/${repository.id}`),
      onError: (error) => {
        if (error instanceof ApiError && error.field) setErrors({ [error.field]: error.message });
      },
    });
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-3">
      {create.isError && !(create.error instanceof ApiError && create.error.field) ? (
        <Notice tone="error">{errorMessage(create.error)}</Notice>
      ) : null}
      <TextField label="Name" name="name" autoComplete="off" placeholder="billing-service" className="font-mono" error={errors.name} />
      <MatchingSettingsFields values={{ ...DEFAULT_REPOSITORY_SETTINGS, cloneBudget: null }} errors={errors} />
      <CloneBudgetField value={null} error={errors.cloneBudget} />
      <Button type="submit" disabled={create.isPending}>
        Add repository
      </Button>
    </form>
  );
}
