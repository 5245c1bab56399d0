import { Section } from '../../components/ui/section';
import { OutboxList } from '../../features/outbox/components/outbox-list';
import { useSignedInUser } from './use-user';
import { useDocumentTitle } from '../../lib/use-document-title';

/**
 * The mail the local fake transport kept when no SMTP server is configured: everyone reads what
 * was sent to them (an issue for check, a remark, a return, a seal); an admin reads all of it.
 */
export function OutboxRoute() {
  const user = useSignedInUser();
  useDocumentTitle(user.isAdmin ? 'Outbox' : 'Your mail');
  return (
    <Section title={user.isAdmin ? 'Outbox' : 'Your mail'}>
      <p className="mb-3 text-sm text-ink-soft">
        {user.isAdmin
          ? 'Every message this installation sent.'
          : `The messages sent to ${user.email}.`}{' '}
        No mail server is configured, so mail is kept here instead of being delivered.
      </p>
      <OutboxList />
    </Section>
  );
}
