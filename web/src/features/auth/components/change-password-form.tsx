import { useState, type FormEvent } from 'react';
import { changePasswordSchema } from '@shared/api/session';
import { Button } from '@/components/button';
import { TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { ApiError } from '@/lib/api-client';
import { validate, type FieldErrors } from '@/lib/form';
import { useChangePassword } from '@/features/auth/api/change-password';

/** Current and new password; other sessions of the user end on success. */
export function ChangePasswordForm() {
  const change = useChangePassword();
  const [errors, setErrors] = useState<FieldErrors>({});

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const formElement = event.currentTarget;
    const form = new FormData(formElement);
    const result = validate(changePasswordSchema, {
      currentPassword: form.get('currentPassword'),
      newPassword: form.get('newPassword'),
    });
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    change.mutate(result.data, {
      onSuccess: () => formElement.reset(),
      onError: (error) => {
        if (error instanceof ApiError && error.field) setErrors({ [error.field]: error.message });
      },
    });
  };

  return (
    <form onSubmit={submit} noValidate className="max-w-sm space-y-4">
      {change.isSuccess ? <Notice>Password changed. Your other sessions were signed out.</Notice> : null}
      {change.isError && !(change.error instanceof ApiError && change.error.field) ? (
        <Notice tone="error">{errorMessage(change.error)}</Notice>
      ) : null}
      <TextField label="Current password" name="currentPassword" type="password" autoComplete="current-password" error={errors.currentPassword} />
      <TextField
        label="New password"
        name="newPassword"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={errors.newPassword}
      />
      <Button type="submit" disabled={change.isPending}>
        Change password
      </Button>
    </form>
  );
}
