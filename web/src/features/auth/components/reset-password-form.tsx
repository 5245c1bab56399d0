import { useState, type FormEvent } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { splitFormError } from '../../../lib/form-errors';
import { useResetPassword } from '../api/reset-password';

const FIELDS = ['newPassword'] as const;

/** The page a reset link opens: the token comes from the link, the password from the person. */
export function ResetPasswordForm({
  token,
  onDone,
}: {
  token: string;
  onDone: (email: string) => void;
}) {
  const reset = useResetPassword();
  const [password, setPassword] = useState('');
  const [repeat, setRepeat] = useState('');
  const [mismatch, setMismatch] = useState(false);
  const { fieldErrors, formError } = splitFormError(reset.error, FIELDS);

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (password !== repeat) {
      setMismatch(true);
      return;
    }
    setMismatch(false);
    reset.mutate({ token, newPassword: password }, { onSuccess: (r) => onDone(r.email) });
  }

  return (
    <form
      onSubmit={submit}
      noValidate
      className="flex flex-col gap-4"
      aria-label="Set a new password"
    >
      <TextField
        label="New password"
        name="newPassword"
        type="password"
        autoComplete="new-password"
        hint="At least 12 characters."
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        error={fieldErrors.newPassword}
      />
      <TextField
        label="New password again"
        name="repeat"
        type="password"
        autoComplete="new-password"
        value={repeat}
        onChange={(e) => setRepeat(e.target.value)}
        error={mismatch ? 'The two passwords differ; type the same password twice.' : undefined}
      />
      {formError ? <Alert>{formError}</Alert> : null}
      <Button type="submit" busy={reset.isPending} className="self-start">
        Set password
      </Button>
    </form>
  );
}
