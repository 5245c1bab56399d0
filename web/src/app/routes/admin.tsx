import { useEffect } from 'react';
import { Section } from '../../components/ui/section';
import { Alert } from '../../components/ui/alert';
import { People } from '../../features/admin/components/people';
import { NewUserForm } from '../../features/admin/components/new-user-form';
import { useSignedInUser } from './use-user';

export function AdminRoute() {
  const user = useSignedInUser();

  useEffect(() => {
    document.title = 'Admin · Modewright';
  }, []);

  if (!user.isAdmin) {
    return (
      <Alert title="Admins only.">
        This page manages the people of the installation; only an installation admin can open it.
      </Alert>
    );
  }
  return (
    <div className="flex flex-col gap-6">
      <h1 className="text-2xl font-semibold">Admin</h1>
      <People meId={user.id} />
      <Section title="Add a person">
        <NewUserForm />
      </Section>
    </div>
  );
}
