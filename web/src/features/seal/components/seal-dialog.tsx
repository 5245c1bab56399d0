import { useState, type FormEvent } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PurposeField } from '../../../components/ui/purpose-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { splitFormError } from '../../../lib/form-errors';
import { useSealRevision } from '../api/seal-revision';

type Moved = { where: string; stored: unknown; fresh: unknown };

/** What the refusal codes mean to a principal, beside the server's own words. */
const REASONS: Record<string, string> = {
  NOT_SIGNED_OFF: 'The checker has not signed this revision off.',
  NO_LICENCE: 'Your profile lacks a licence number or jurisdiction.',
  WRONG_PASSWORD: 'The password was not right.',
  RESULTS_DO_NOT_REPRODUCE: 'A fresh evaluation did not reproduce the stored results.',
  SIGNING_KEY_LOCKED: 'Your signing key cannot be unlocked.',
};

/**
 * The principal's seal: the password typed again unlocks their signing key; the server evaluates
 * the revision afresh and seals only when the stored results are reproduced.
 */
export function SealDialog({
  revisionId,
  revisionNumber,
  purpose: currentPurpose,
}: {
  revisionId: number;
  revisionNumber: number;
  /** What the revision is for now (signed off for, or issued for). */
  purpose: string;
}) {
  const [open, setOpen] = useState(false);
  const [password, setPassword] = useState('');
  const [purpose, setPurpose] = useState('');
  const seal = useSealRevision(revisionId);
  const { fieldErrors, formError } = splitFormError(seal.error, ['password']);

  if (seal.data) {
    return (
      <Alert tone="success" title={`Rev ${revisionNumber} is sealed.`}>
        A fresh evaluation reproduced the stored results. Seal code{' '}
        <span className="font-mono">{seal.data.seal.code}</span>.
      </Alert>
    );
  }
  if (!open) {
    return (
      <div>
        <Button onClick={() => setOpen(true)}>Seal Rev {revisionNumber}</Button>
      </div>
    );
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    seal.mutate(
      { password, ...(purpose.trim() ? { purpose } : {}) },
      { onSettled: () => setPassword('') },
    );
  }

  const error = seal.error;
  const code = isApiError(error) ? error.code : null;
  const moved =
    isApiError(error) && Array.isArray(error.details?.moved)
      ? (error.details.moved as Moved[])
      : [];
  const tolerance = isApiError(error) ? error.details?.tolerance : undefined;

  return (
    <form
      onSubmit={submit}
      aria-label={`Seal Rev ${revisionNumber}`}
      className="flex max-w-xl flex-col gap-2"
    >
      <h3 className="text-sm font-semibold text-ink">Seal Rev {revisionNumber}</h3>
      <p className="text-sm text-ink-soft">
        Sealing states that you, as principal, take responsibility for Rev {revisionNumber}. Type
        your password again: it unlocks your signing key. The server first evaluates the revision
        afresh and seals only if the stored results are reproduced.
      </p>
      <PurposeField
        label="Sealed for"
        current={currentPurpose}
        value={purpose}
        onChange={setPurpose}
      />
      <TextField
        label="Your password"
        name="password"
        type="password"
        autoComplete="current-password"
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        error={fieldErrors.password}
      />
      {formError ? (
        <Alert title={`Not sealed. ${code && REASONS[code] ? REASONS[code] : ''}`}>
          <p>{formError}</p>
          {moved.length > 0 ? (
            <>
              <p className="mt-1">
                Values that moved
                {typeof tolerance === 'number' ? ` (beyond relative ${tolerance})` : ''}:
              </p>
              <ul className="list-disc pl-5 font-mono text-xs">
                {moved.slice(0, 20).map((m) => (
                  <li key={m.where}>
                    {m.where}: stored {JSON.stringify(m.stored)}, now {JSON.stringify(m.fresh)}
                  </li>
                ))}
              </ul>
            </>
          ) : null}
        </Alert>
      ) : null}
      <div className="flex gap-2">
        <Button type="submit" busy={seal.isPending}>
          {seal.isPending ? 'Checking the results…' : `Seal Rev ${revisionNumber}`}
        </Button>
        <Button variant="secondary" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
