import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { CheckboxGroup } from '../../../components/ui/checkbox-group';
import { Alert } from '../../../components/ui/alert';
import { splitFormError } from '../../../lib/form-errors';
import type { ProjectRole } from '../../../config/words';
import { useAddMember } from '../api/add-member';
import { ROLE_OPTIONS } from './role-options';

const FIELDS = ['email', 'roles'] as const;

export function AddMemberForm({ projectId }: { projectId: number }) {
  const add = useAddMember(projectId);
  const [email, setEmail] = useState('');
  const [roles, setRoles] = useState<string[]>([]);
  const [added, setAdded] = useState<string | null>(null);
  const { fieldErrors, formError } = splitFormError(add.error, FIELDS);

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setAdded(null);
    add.mutate(
      { email: email.trim(), roles: roles as ProjectRole[] },
      {
        onSuccess: (member) => {
          setAdded(`${member.name} was added to the project.`);
          setEmail('');
          setRoles([]);
        },
      },
    );
  }

  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label="Add a member"
      className="mt-4 flex flex-col gap-3 border-t border-rule pt-4"
    >
      <h3 className="text-sm font-semibold">Add a member</h3>
      <div className="grid items-start gap-3 md:grid-cols-[minmax(14rem,1fr)_auto]">
        <TextField
          label="Member's e-mail"
          name="email"
          type="email"
          autoComplete="off"
          hint="The person must already have a sign-in; an admin adds people on the Admin page."
          value={email}
          onChange={(e) => setEmail(e.target.value)}
          error={fieldErrors.email}
        />
        <CheckboxGroup
          legend="Roles"
          name="roles"
          options={ROLE_OPTIONS}
          value={roles}
          onChange={setRoles}
          error={fieldErrors.roles}
        />
      </div>
      {formError ? <Alert>{formError}</Alert> : null}
      {added ? <Alert tone="success">{added}</Alert> : null}
      <Button type="submit" busy={add.isPending} className="self-start">
        Add member
      </Button>
    </form>
  );
}
