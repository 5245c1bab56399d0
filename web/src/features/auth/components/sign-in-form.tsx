import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { Alert } from '../../../components/ui/alert';
import { splitFormError } from '../../../lib/form-errors';
import { useSignIn } from '../api/sign-in';
import type { User } from '../../../../../core/contract/people';

const FIELDS = ['email', 'password'] as const;

export function SignInForm({ onSignedIn }: { onSignedIn: (user: User) => void }) {
  const signIn = useSignIn();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const { fieldErrors, formError } = splitFormError(signIn.error, FIELDS);
  const formErrorId = 'sign-in-error';

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    signIn.mutate({ email: email.trim(), password }, { onSuccess: onSignedIn });
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4" aria-label="Sign in">
      <TextField
        label="E-mail"
        name="email"
        type="email"
        autoComplete="username"
        required
        value={email}
        onChange={(e) => setEmail(e.target.value)}
        error={fieldErrors.email}
      />
      <div className="flex flex-col gap-2">
        <TextField
          label="Password"
          name="password"
          type="password"
          autoComplete="current-password"
          required
          value={password}
          onChange={(e) => setPassword(e.target.value)}
          error={fieldErrors.password}
          // A refusal that names neither input (wrong e-mail or password) belongs to both; it is
          // shown under the password, where the eye is after pressing Sign in.
          aria-invalid={fieldErrors.password || formError ? true : undefined}
          aria-describedby={formError ? formErrorId : undefined}
        />
        {formError ? <Alert id={formErrorId}>{formError}</Alert> : null}
      </div>
      <Button type="submit" busy={signIn.isPending} className="self-start">
        Sign in
      </Button>
    </form>
  );
}
