import { useState, type FormEvent } from 'react';
import { inviteUserSchema } from '@shared/api/invitations';
import { ROLES, ROLE_LABELS } from '@shared/roles';
import { Button } from '@/components/button';
import { SelectField, TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { ApiError } from '@/lib/api-client';
import { validate, type FieldErrors } from '@/lib/form';
import { useCreateInvitation } from '@/features/invitations/api/create-invitation';

/** Name, e-mail and role; sends the one-time link by mail. */
export function InviteUserForm() {
  const invite = useCreateInvitation();
  const [errors, setErrors] = useState<FieldErrors>({});
  const [sentTo, setSentTo] = useState<string>();

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const formElement = event.currentTarget;
    const form = new FormData(formElement);
    const result = validate(inviteUserSchema, { name: form.get('name'), email: form.get('email'), role: form.get('role') });
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    invite.mutate(result.data, {
      onSuccess: (invitation) => {
        setSentTo(invitation.email);
        formElement.reset();
      },
      onError: (error) => {
        if (error instanceof ApiError && error.field) setErrors({ [error.field]: error.message });
      },
    });
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-3">
      {sentTo && invite.isSuccess ? <Notice>Invitation sent to {sentTo}.</Notice> : null}
      {invite.isError && !(invite.error instanceof ApiError && invite.error.field) ? (
        <Notice tone="error">{errorMessage(invite.error)}</Notice>
      ) : null}
      <TextField label="Name" name="name" autoComplete="off" error={errors.name} />
      <TextField label="E-mail" name="email" type="email" autoComplete="off" error={errors.email} />
      <SelectField label="Role" name="role" defaultValue="engineer" error={errors.role}>
        {ROLES.map((role) => (
          <option key={role} value={role}>
            {ROLE_LABELS[role]}
          </option>
        ))}
      </SelectField>
      <Button type="submit" disabled={invite.isPending}>
        Send invitation
      </Button>
    </form>
  );
}
