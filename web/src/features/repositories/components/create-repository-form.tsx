import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { createRepositorySchema } from '../../../../../shared/api/repositories';
import { DEFAULT_REPOSITORY_SETTINGS, INDEX_MIN_THRESHOLD } from '../../../../../shared/constants';
import { Button } from '../../../components/button';
import { TextField } from '../../../components/field';
import { Notice, errorMessage } from '../../../components/notice';
import { ApiError } from '../../../lib/api-client';
import { optionalNumber, validate, type FieldErrors } from '../../../lib/form';
import { useCreateRepository } from '../api/create-repository';

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
      threshold: optionalNumber(form.get('threshold')),
      minTokens: optionalNumber(form.get('minTokens')),
      shingleSize: optionalNumber(form.get('shingleSize')),
      cloneBudget: optionalNumber(form.get('cloneBudget')),
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
      <div className="grid grid-cols-3 gap-2">
        <TextField
          label="Threshold"
          name="threshold"
          type="number"
          step="0.01"
          min={INDEX_MIN_THRESHOLD}
          max={1}
          defaultValue={DEFAULT_REPOSITORY_SETTINGS.threshold}
          error={errors.threshold}
        />
        <TextField label="Min tokens" name="minTokens" type="number" min={5} defaultValue={DEFAULT_REPOSITORY_SETTINGS.minTokens} error={errors.minTokens} />
        <TextField label="Shingle" name="shingleSize" type="number" min={1} max={10} defaultValue={DEFAULT_REPOSITORY_SETTINGS.shingleSize} error={errors.shingleSize} />
      </div>
      <TextField
        label="Clone budget"
        name="cloneBudget"
        type="number"
        step="0.005"
        min={0}
        max={1}
        placeholder="none"
        hint="A share of tokens, 0.05 = 5 %. Empty: no budget."
        error={errors.cloneBudget}
      />
      <Button type="submit" disabled={create.isPending}>
        Add repository
      </Button>
    </form>
  );
}
