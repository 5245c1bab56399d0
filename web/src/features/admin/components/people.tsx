import { useState } from 'react';
import { Section } from '../../../components/ui/section';
import { useUsers } from '../api/get-users';
import { ManagePerson } from './manage-person';
import { UsersTable } from './users-table';

/** The people table, and below it the panel for the person picked with "Manage". */
export function People({ meId }: { meId: number }) {
  const [selectedId, setSelectedId] = useState<number | null>(null);
  const users = useUsers();
  const selected = users.data?.find((u) => u.id === selectedId);
  return (
    <>
      <Section title="People">
        <UsersTable selectedId={selectedId} onSelect={setSelectedId} />
      </Section>
      {selected ? (
        <Section title={`Manage ${selected.name}`}>
          <ManagePerson person={selected} meId={meId} />
        </Section>
      ) : null}
    </>
  );
}
