import { useState, type FormEvent } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { splitFormError } from '../../../lib/form-errors';
import { formatUtc } from '../../../lib/format';
import type { ManagedUser } from '../api/get-users';
import { useSendPasswordReset } from '../api/send-password-reset';
import { useSetUserActive } from '../api/set-user-active';
import { useUpdateUser } from '../api/update-user';
import { LicenceFields, NameEmailFields } from './person-fields';

const FIELDS = ['name', 'email', 'licenceNumber', 'jurisdiction'] as const;

/** Edit one person's details, send them a reset link, deactivate or reactivate them. */
export function ManagePerson({ person, meId }: { person: ManagedUser; meId: number }) {
  return (
    <div className="flex flex-col gap-5">
      <EditPersonForm key={person.id} person={person} />
      <ResetLink key={`reset-${person.id}`} person={person} />
      <AccountAccess key={`access-${person.id}`} person={person} isMe={person.id === meId} />
    </div>
  );
}

function EditPersonForm({ person }: { person: ManagedUser }) {
  const update = useUpdateUser();
  const initial = {
    name: person.name,
    email: person.email,
    licenceNumber: person.licenceNumber ?? '',
    jurisdiction: person.jurisdiction ?? '',
  };
  const [fields, setFields] = useState(initial);
  const [saved, setSaved] = useState<string | null>(null);
  const { fieldErrors, formError } = splitFormError(update.error, FIELDS);
  const set = (key: keyof typeof initial) => (e: { target: { value: string } }) =>
    setFields((f) => ({ ...f, [key]: e.target.value }));

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setSaved(null);
    update.mutate(
      {
        id: person.id,
        name: fields.name.trim(),
        email: fields.email.trim(),
        licenceNumber: fields.licenceNumber.trim(),
        jurisdiction: fields.jurisdiction.trim(),
      },
      { onSuccess: (user) => setSaved(`Saved the details of ${user.name}.`) },
    );
  }

  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label={`Details of ${person.name}`}
      className="flex flex-col gap-3"
    >
      <div className="grid gap-3 sm:grid-cols-2">
        <NameEmailFields values={fields} onChange={set} errors={fieldErrors} />
        <LicenceFields
          values={fields}
          onChange={set}
          errors={fieldErrors}
          licenceHint="Leave empty to remove it; a principal needs one to seal."
        />
      </div>
      {formError ? <Alert>{formError}</Alert> : null}
      {saved ? <Alert tone="success">{saved}</Alert> : null}
      <Button type="submit" busy={update.isPending} className="self-start">
        Save details
      </Button>
    </form>
  );
}

function ResetLink({ person }: { person: ManagedUser }) {
  const send = useSendPasswordReset();
  return (
    <div className="flex flex-col gap-2 border-t border-rule pt-4">
      <h3 className="text-sm font-semibold">Password</h3>
      <p className="text-sm text-ink-soft">
        Mails {person.email} a link that sets a new password. It works once, for 24 hours, and an
        earlier link stops working. Nobody, admins included, ever sees the password.
      </p>
      {send.isError ? <Alert>{send.error.message}</Alert> : null}
      {send.data ? (
        <Alert tone="success">
          Reset link sent to {person.email}; it works until {formatUtc(send.data.expiresAt)}.
        </Alert>
      ) : null}
      <Button
        variant="secondary"
        className="self-start"
        busy={send.isPending}
        disabled={person.deactivatedAt !== null}
        onClick={() => send.mutate(person.id)}
      >
        Send reset link
      </Button>
    </div>
  );
}

function AccountAccess({ person, isMe }: { person: ManagedUser; isMe: boolean }) {
  const setActive = useSetUserActive();
  const deactivated = person.deactivatedAt !== null;
  return (
    <div className="flex flex-col gap-2 border-t border-rule pt-4">
      <h3 className="text-sm font-semibold">Access</h3>
      {deactivated ? (
        <p className="text-sm text-ink-soft">
          Deactivated since {formatUtc(person.deactivatedAt!)}: {person.name} cannot sign in. Their
          revisions, remarks, seals and history are kept.
        </p>
      ) : (
        <p className="text-sm text-ink-soft">
          Deactivating signs {person.name} out everywhere at once and refuses their sign-in. Nothing
          they wrote, checked or sealed changes, and they can be reactivated.
        </p>
      )}
      {setActive.isError ? <Alert>{setActive.error.message}</Alert> : null}
      {setActive.data && setActive.data.user.id === person.id ? (
        <Alert tone="success">
          {setActive.data.user.deactivatedAt
            ? `${person.name} is deactivated; ${setActive.data.sessionsEnded ?? 0} session(s) ended.`
            : `${person.name} can sign in again.`}
        </Alert>
      ) : null}
      {isMe ? (
        <p className="text-sm text-ink-faint">You cannot deactivate your own account.</p>
      ) : (
        <Button
          variant={deactivated ? 'secondary' : 'danger'}
          className="self-start"
          busy={setActive.isPending}
          onClick={() => setActive.mutate({ id: person.id, active: deactivated })}
        >
          {deactivated ? `Reactivate ${person.name}` : `Deactivate ${person.name}`}
        </Button>
      )}
    </div>
  );
}
