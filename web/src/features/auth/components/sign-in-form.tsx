import { useState, type FormEvent } from 'react';
import { signInSchema } from '@shared/api/session';
import { Button } from '@/components/button';
import { TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { validate, type FieldErrors } from '@/lib/form';
import { useSignIn } from '@/features/auth/api/sign-in';

/** E-mail and password; on success the session query holds the user. */
export function SignInForm({ onSignedIn }: { onSignedIn?: () => void }) {
  const signIn = useSignIn();
  const [errors, setErrors] = useState<FieldErrors>({});

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const result = validate(signInSchema, { email: form.get('email'), password: form.get('password') });
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    signIn.mutate(result.data, { onSuccess: () => onSignedIn?.() });
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {signIn.isError ? <Notice tone="error">{errorMessage(signIn.error)}</Notice> : null}
      <TextField label="E-mail" name="email" type="email" autoComplete="username" autoFocus error={errors.email} />
      <TextField label="Password" name="password" type="password" autoComplete="current-password" error={errors.password} />
      <Button type="submit" className="w-full justify-center" disabled={signIn.isPending}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
