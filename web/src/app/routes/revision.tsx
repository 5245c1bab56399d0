import { Link, useParams } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { paths } from '../../config/paths';
import { RevisionView } from '../../features/review/components/revision-view';
import { SealDialog } from '../../features/seal/components/seal-dialog';
import { useSignedInUser } from './use-user';

/** A revision, read-only, with its remarks; the checker's and principal's actions. */
export function RevisionRoute() {
  const user = useSignedInUser();
  const { revisionId: raw } = useParams();
  const revisionId = Number(raw);
  if (!Number.isInteger(revisionId) || revisionId <= 0) {
    return (
      <Alert title="No such revision.">
        “{raw}” is not a revision number. <Link to={paths.projects.href()}>Back to projects</Link>
      </Alert>
    );
  }
  return (
    <RevisionView
      revisionId={revisionId}
      user={user}
      links={{
        sheet: paths.sheet.href,
        print: paths.print.href,
        compare: paths.compare.href,
        verify: (code) => paths.verify.href(code),
      }}
      // only a principal of the project has a seal action; for everyone else the panel stays away
      sealAction={(rev) =>
        rev.myRoles.includes('principal') ? (
          <SealDialog key={rev.id} revisionId={rev.id} revisionNumber={rev.number} />
        ) : null
      }
    />
  );
}
