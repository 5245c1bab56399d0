import { Table, Td, Th } from '../../../components/ui/table';
import { Spinner } from '../../../components/ui/spinner';
import { QueryError } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { FilterBar } from '../../../components/ui/filter-bar';
import { Badge } from '../../../components/ui/badge';
import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { useUsers } from '../api/get-users';

/** Everyone who may sign in; "Manage" picks the person the panel below edits. */
export function UsersTable({
  selectedId,
  onSelect,
}: {
  selectedId: number | null;
  onSelect: (id: number) => void;
}) {
  const users = useUsers();
  const [filter, setFilter] = useState('');

  if (users.isPending) return <Spinner label="Loading people…" />;
  if (users.isError) {
    return <QueryError what="the people" error={users.error} onRetry={() => users.refetch()} />;
  }
  if (users.data.length === 0) return <EmptyState title="No people yet" />;

  const needle = filter.trim().toLowerCase();
  const shown = needle
    ? users.data.filter(
        (u) => u.name.toLowerCase().includes(needle) || u.email.toLowerCase().includes(needle),
      )
    : users.data;

  return (
    <>
      <FilterBar
        label="Filter people"
        placeholder="Name or e-mail"
        value={filter}
        onChange={setFilter}
        shown={shown.length}
        total={users.data.length}
        countWords={plural}
        widthClass="w-72"
      />
      {shown.length === 0 ? (
        <EmptyState title="No one matches the filter" />
      ) : (
        <Table caption="People">
          <thead>
            <tr>
              <Th>Name</Th>
              <Th>E-mail</Th>
              <Th>Admin</Th>
              <Th>Licence no.</Th>
              <Th>Jurisdiction</Th>
              <Th>Status</Th>
              <Th>
                <span className="sr-only">Actions</span>
              </Th>
            </tr>
          </thead>
          <tbody>
            {shown.map((user) => (
              <tr key={user.id}>
                <Td className="font-medium">{user.name}</Td>
                <Td className="font-mono text-xs leading-5">{user.email}</Td>
                <Td>
                  {user.isAdmin ? (
                    <Badge tone="accent">Admin</Badge>
                  ) : (
                    <span className="text-ink-faint">no</span>
                  )}
                </Td>
                <Td className="font-mono text-xs leading-5">{user.licenceNumber ?? '—'}</Td>
                <Td>{user.jurisdiction ?? '—'}</Td>
                <Td>
                  {user.deactivatedAt ? (
                    <Badge>Deactivated</Badge>
                  ) : (
                    <span className="text-ink-soft">Active</span>
                  )}
                </Td>
                <Td>
                  <Button
                    variant="quiet"
                    aria-pressed={selectedId === user.id}
                    aria-label={`Manage ${user.name}`}
                    onClick={() => onSelect(user.id)}
                  >
                    Manage
                  </Button>
                </Td>
              </tr>
            ))}
          </tbody>
        </Table>
      )}
    </>
  );
}

const plural = (n: number) => `${n} ${n === 1 ? 'person' : 'people'}`;
