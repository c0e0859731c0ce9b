import { useState, type FormEvent } from 'react';
import { acceptInvitationSchema, type InvitationPreviewDTO } from '@shared/api/invitations';
import { ROLE_LABELS } from '@shared/roles';
import { Button } from '@/components/button';
import { TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { validate, type FieldErrors } from '@/lib/form';
import { useAcceptInvitation } from '@/features/invitations/api/accept-invitation';

/** Name and a new password for the invitee; calls onAccepted with the password to sign in with. */
export function AcceptInvitationForm({
  token,
  preview,
  onAccepted,
}: {
  token: string;
  preview: InvitationPreviewDTO;
  onAccepted: (credentials: { email: string; password: string }) => void;
}) {
  const accept = useAcceptInvitation();
  const [errors, setErrors] = useState<FieldErrors>({});

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    if (form.get('password') !== form.get('repeat')) return setErrors({ repeat: 'The passwords differ.' });
    const result = validate(acceptInvitationSchema, { name: form.get('name'), password: form.get('password') });
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    accept.mutate(
      { token, ...result.data },
      { onSuccess: (user) => onAccepted({ email: user.email, password: result.data.password }) },
    );
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      <p className="text-sm">
        Join <strong>{preview.organisationName}</strong> as <strong>{ROLE_LABELS[preview.role]}</strong>. You will sign in
        as <span className="font-mono">{preview.email}</span>.
      </p>
      {accept.isError ? <Notice tone="error">{errorMessage(accept.error)}</Notice> : null}
      <TextField label="Your name" name="name" defaultValue={preview.name} error={errors.name} />
      <TextField label="Password" name="password" type="password" autoComplete="new-password" hint="At least 10 characters." error={errors.password} />
      <TextField label="Password again" name="repeat" type="password" autoComplete="new-password" error={errors.repeat} />
      <Button type="submit" className="w-full justify-center" disabled={accept.isPending}>
        Set password and join
      </Button>
    </form>
  );
}
