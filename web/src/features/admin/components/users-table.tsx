import { Table, Td, Th } from '../../../components/ui/table';
import { Spinner } from '../../../components/ui/spinner';
import { QueryError } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { Badge } from '../../../components/ui/badge';
import { useUsers } from '../api/get-users';

export function UsersTable() {
  const users = useUsers();

  if (users.isPending) return <Spinner label="Loading people…" />;
  if (users.isError) {
    return <QueryError what="the people" error={users.error} onRetry={() => users.refetch()} />;
  }
  if (users.data.length === 0) return <EmptyState title="No people yet" />;

  return (
    <Table caption="People">
      <thead>
        <tr>
          <Th>Name</Th>
          <Th>E-mail</Th>
          <Th>Admin</Th>
          <Th>Licence no.</Th>
          <Th>Jurisdiction</Th>
        </tr>
      </thead>
      <tbody>
        {users.data.map((user) => (
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
          </tr>
        ))}
      </tbody>
    </Table>
  );
}
