import { useEffect, useRef, useState } from 'react';
import { Table, Td, Th } from '../../../components/ui/table';
import { Spinner } from '../../../components/ui/spinner';
import { Alert, QueryError } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { CheckboxGroup } from '../../../components/ui/checkbox-group';
import { roleLabel, type ProjectRole } from '../../../config/words';
import { splitFormError } from '../../../lib/form-errors';
import { useMembers } from '../api/get-members';
import { useChangeMemberRoles } from '../api/change-member-roles';
import { useRemoveMember } from '../api/remove-member';
import { ROLE_OPTIONS } from './role-options';
import type { Member } from '../../../../../core/contract/projects';

export function MembersTable({ projectId, canManage }: { projectId: number; canManage: boolean }) {
  const members = useMembers(projectId);

  if (members.isPending) return <Spinner label="Loading members…" />;
  if (members.isError) {
    return (
      <QueryError what="the members" error={members.error} onRetry={() => members.refetch()} />
    );
  }
  if (members.data.length === 0) {
    return (
      <EmptyState title="No members yet">
        {canManage ? 'Add the author, checker and principal below.' : null}
      </EmptyState>
    );
  }
  return (
    <Table caption="Members">
      <thead>
        <tr>
          <Th>Name</Th>
          <Th>E-mail</Th>
          <Th>Roles</Th>
          {canManage ? <Th className="text-right">Manage</Th> : null}
        </tr>
      </thead>
      <tbody>
        {members.data.map((member) => (
          <MemberRow
            key={member.userId}
            projectId={projectId}
            member={member}
            canManage={canManage}
          />
        ))}
      </tbody>
    </Table>
  );
}

function MemberRow({
  projectId,
  member,
  canManage,
}: {
  projectId: number;
  member: Member;
  canManage: boolean;
}) {
  const [mode, setMode] = useState<'view' | 'roles' | 'remove'>('view');
  const [roles, setRoles] = useState<string[]>(member.roles);
  const change = useChangeMemberRoles(projectId);
  const remove = useRemoveMember(projectId);
  const changeError = splitFormError(change.error, ['roles']);
  const removeError = splitFormError(remove.error, []);
  // Keyboard users land back on "Change roles" when an inline editor closes.
  const changeButton = useRef<HTMLButtonElement>(null);
  const wasEditing = useRef(false);
  useEffect(() => {
    if (mode === 'view' && wasEditing.current) changeButton.current?.focus();
    wasEditing.current = mode !== 'view';
  }, [mode]);

  const cancel = () => {
    setMode('view');
    setRoles(member.roles);
    change.reset();
    remove.reset();
  };

  return (
    <tr aria-label={member.name}>
      <Td className="font-medium">{member.name}</Td>
      <Td className="font-mono text-xs leading-5">{member.email}</Td>
      <Td>
        {mode === 'roles' ? (
          <form
            aria-label={`Roles of ${member.name}`}
            className="flex flex-col gap-2"
            onSubmit={(event) => {
              event.preventDefault();
              change.mutate(
                { userId: member.userId, roles: roles as ProjectRole[] },
                { onSuccess: () => setMode('view') },
              );
            }}
          >
            <CheckboxGroup
              legend={`Roles of ${member.name}`}
              legendHidden
              autoFocusFirst
              name="roles"
              options={ROLE_OPTIONS}
              value={roles}
              onChange={setRoles}
              error={changeError.fieldErrors.roles}
            />
            {changeError.formError ? <Alert>{changeError.formError}</Alert> : null}
            <div className="flex gap-2">
              <Button type="submit" busy={change.isPending}>
                Save roles
              </Button>
              <Button variant="secondary" onClick={cancel}>
                Cancel
              </Button>
            </div>
          </form>
        ) : (
          <span className="flex flex-wrap gap-1">
            {member.roles.map((role) => (
              <Badge key={role}>{roleLabel(role)}</Badge>
            ))}
          </span>
        )}
      </Td>
      {canManage ? (
        <Td className="text-right">
          {mode === 'view' ? (
            <span className="inline-flex gap-1">
              <Button
                ref={changeButton}
                variant="quiet"
                aria-label={`Change roles of ${member.name}`}
                onClick={() => setMode('roles')}
              >
                Change roles
              </Button>
              <Button
                variant="quiet"
                aria-label={`Remove ${member.name}`}
                onClick={() => setMode('remove')}
              >
                Remove
              </Button>
            </span>
          ) : null}
          {mode === 'remove' ? (
            <div className="flex flex-col items-end gap-2">
              <p className="text-sm">Remove {member.name} from this project?</p>
              {removeError.formError ? <Alert>{removeError.formError}</Alert> : null}
              <span className="inline-flex gap-2">
                <Button
                  variant="danger"
                  busy={remove.isPending}
                  onClick={() => remove.mutate(member.userId)}
                >
                  Remove {member.name}
                </Button>
                <Button variant="secondary" onClick={cancel} autoFocus>
                  Keep
                </Button>
              </span>
            </div>
          ) : null}
        </Td>
      ) : null}
    </tr>
  );
}
