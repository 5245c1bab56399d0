import { Link, useParams } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { paths } from '../../config/paths';
import { useRevision } from '../../features/review/api/get-revision';
import { RevisionView } from '../../features/review/components/revision-view';
import { SaveTemplate } from '../../features/sheets/components/save-template';
import { SealDialog } from '../../features/seal/components/seal-dialog';
import { useGoToPlace } from '../../lib/use-go-to-place';
import { useSignedInUser } from './use-user';

/** A revision, read-only, with its remarks; the checker's and principal's actions. */
export function RevisionRoute() {
  const user = useSignedInUser();
  const { revisionId: raw } = useParams();
  const revisionId = Number(raw);
  const valid = Number.isInteger(revisionId) && revisionId > 0;
  // The view's own query (cached): whether this person may save the revision as a firm template.
  const rev = useRevision(revisionId, valid).data;
  // `?block=…&line=…[&remark=…]` (a search result, a shared link): that line, that remark.
  useGoToPlace('revision');
  if (!Number.isInteger(revisionId) || revisionId <= 0) {
    return (
      <Alert title="No such revision.">
        “{raw}” is not a revision number. <Link to={paths.projects.href()}>Back to projects</Link>
      </Alert>
    );
  }
  return (
    <div className="flex flex-col gap-4">
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
            <SealDialog
              key={rev.id}
              revisionId={rev.id}
              revisionNumber={rev.number}
              purpose={rev.checkedPurpose ?? rev.purpose}
            />
          ) : null
        }
      />
      {rev && (rev.myRoles.includes('author') || user.isAdmin) ? (
        <SaveTemplate
          sheetId={rev.sheet.id}
          sheetNumber={rev.sheet.number}
          revision={{ id: rev.id, number: rev.number }}
        />
      ) : null}
    </div>
  );
}
