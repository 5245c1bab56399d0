import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { Alert } from '../../../components/ui/alert';
import { splitFormError } from '../../../lib/form-errors';
import { useCreateUser, type CreateUserInput } from '../api/create-user';
import { LicenceFields, NameEmailFields } from './person-fields';

const FIELDS = ['name', 'email', 'password', 'isAdmin', 'licenceNumber', 'jurisdiction'] as const;
const EMPTY = { name: '', email: '', password: '', licenceNumber: '', jurisdiction: '' };

/** Admins add the people who may sign in; a principal needs a licence number to seal. */
export function NewUserForm() {
  const create = useCreateUser();
  const [fields, setFields] = useState(EMPTY);
  const [isAdmin, setIsAdmin] = useState(false);
  const [added, setAdded] = useState<string | null>(null);
  const { fieldErrors, formError } = splitFormError(create.error, FIELDS);
  const set = (key: keyof typeof EMPTY) => (e: { target: { value: string } }) =>
    setFields((f) => ({ ...f, [key]: e.target.value }));

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setAdded(null);
    const input: CreateUserInput = {
      name: fields.name.trim(),
      email: fields.email.trim(),
      password: fields.password,
      isAdmin,
      ...(fields.licenceNumber.trim() ? { licenceNumber: fields.licenceNumber.trim() } : {}),
      ...(fields.jurisdiction.trim() ? { jurisdiction: fields.jurisdiction.trim() } : {}),
    };
    create.mutate(input, {
      onSuccess: (user) => {
        setAdded(`${user.name} can now sign in as ${user.email}.`);
        setFields(EMPTY);
        setIsAdmin(false);
      },
    });
  }

  return (
    <form onSubmit={submit} noValidate aria-label="Add a person" className="flex flex-col gap-3">
      <div className="grid gap-3 sm:grid-cols-2">
        <NameEmailFields values={fields} onChange={set} errors={fieldErrors} />
        <TextField
          label="Initial password"
          name="password"
          type="password"
          autoComplete="new-password"
          hint="Give it to the person privately; it is never shown again."
          value={fields.password}
          onChange={set('password')}
          error={fieldErrors.password}
        />
        <div className="flex items-center gap-2 pt-6">
          <input
            id="new-user-admin"
            type="checkbox"
            name="isAdmin"
            checked={isAdmin}
            onChange={(e) => setIsAdmin(e.target.checked)}
            className="size-4 accent-accent"
          />
          <label htmlFor="new-user-admin" className="text-sm">
            Installation admin (manages people and projects)
          </label>
        </div>
        <LicenceFields
          values={fields}
          onChange={set}
          errors={fieldErrors}
          labelSuffix=" (principals)"
        />
      </div>
      {fieldErrors.isAdmin ? <Alert>{fieldErrors.isAdmin}</Alert> : null}
      {formError ? <Alert>{formError}</Alert> : null}
      {added ? <Alert tone="success">{added}</Alert> : null}
      <Button type="submit" busy={create.isPending} className="self-start">
        Add person
      </Button>
    </form>
  );
}
