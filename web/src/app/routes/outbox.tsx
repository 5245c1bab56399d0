import { Alert } from '../../components/ui/alert';
import { Section } from '../../components/ui/section';
import { OutboxList } from '../../features/outbox/components/outbox-list';
import { useSignedInUser } from './use-user';

/** Admins read the mail the local fake transport kept when no SMTP server is configured. */
export function OutboxRoute() {
  const user = useSignedInUser();
  if (!user.isAdmin) {
    return <Alert title="Administrators only.">The outbox is shown to administrators.</Alert>;
  }
  return (
    <Section title="Outbox">
      <OutboxList />
    </Section>
  );
}
