import { useState, type FormEvent } from 'react';
import { QueryError } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { TextField } from '../../../components/ui/text-field';
import { formatUtc } from '../../../lib/format';
import { useVerification, type Verification } from '../api/get-verification';
import { DIGEST_WORDS } from '../../../config/digests';

/** The code box of /verify: anyone types the code printed in a seal block. */
export function VerifyCodeForm({
  initial = '',
  onSubmit,
}: {
  initial?: string;
  onSubmit: (code: string) => void;
}) {
  const [code, setCode] = useState(initial);
  const [error, setError] = useState<string | undefined>();
  function submit(event: FormEvent) {
    event.preventDefault();
    const trimmed = code.trim();
    if (!trimmed) {
      setError('Type the seal code printed in the seal block of the calculation.');
      return;
    }
    onSubmit(trimmed);
  }
  return (
    <form onSubmit={submit} aria-label="Verify a seal" className="flex items-end gap-2">
      <TextField
        label="Seal code"
        name="code"
        mono
        value={code}
        onChange={(e) => {
          setCode(e.target.value);
          setError(undefined);
        }}
        error={error}
        className="flex-1"
      />
      <Button type="submit">Verify</Button>
    </form>
  );
}

const VERDICT: Record<Verification['verdict'], { title: string; tone: string; text: string }> = {
  genuine: {
    title: 'Genuine',
    tone: 'border-pass bg-pass-soft text-pass',
    text: 'The stored revision gives the sealed digest, and the signature is the principal’s.',
  },
  'does-not-match': {
    title: 'Does not match',
    tone: 'border-fail bg-fail-soft text-fail',
    text: 'Something changed since it was sealed: do not rely on this calculation.',
  },
  'unknown-code': {
    title: 'Unknown code',
    tone: 'border-rule-strong bg-paper-deep text-ink',
    text: 'No seal has this code. Check the code as printed.',
  },
};

/**
 * A rename after sealing: shown under the sealed value, never in its place, and marked as not
 * part of the seal.
 */
function NowNamed({
  number,
  title,
  label,
}: {
  number: string | undefined;
  title: string | undefined;
  label: string;
}) {
  if (number === undefined && title === undefined) return null;
  const words = [
    number !== undefined ? `now numbered ${number}` : null,
    title !== undefined ? `now titled “${title}”` : null,
  ]
    .filter(Boolean)
    .join(', ');
  return (
    <span className="block text-xs text-ink-soft" aria-label={`Later change of the ${label}`}>
      {words} — not part of the seal
    </span>
  );
}

/** The public verdict on one seal code, recomputed by the server on every visit. */
export function VerifyResult({ code }: { code: string }) {
  const verification = useVerification(code);
  if (verification.isPending) return <Spinner label="Recomputing the digest and signature…" />;
  if (verification.isError) {
    return (
      <QueryError
        what="the verdict"
        error={verification.error}
        onRetry={() => verification.refetch()}
      />
    );
  }
  const v = verification.data;
  const verdict = VERDICT[v.verdict];
  return (
    <section aria-label="Verdict" className="flex flex-col gap-3">
      <div className={`rounded-sm border-l-4 px-4 py-3 ${verdict.tone}`} role="status">
        <p className="text-lg font-semibold" data-testid="verdict">
          {verdict.title}
        </p>
        <p className="text-sm">{verdict.text}</p>
      </div>
      {v.reasons.length > 0 ? (
        <ul className="list-disc pl-5 text-sm text-fail" aria-label="Reasons">
          {v.reasons.map((r) => (
            <li key={r}>{r}</li>
          ))}
        </ul>
      ) : null}
      {v.notes.length > 0 ? (
        <ul className="list-disc pl-5 text-sm text-ink-soft" aria-label="Notes">
          {v.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      ) : null}
      {v.sheet ? (
        <dl className="grid grid-cols-[10rem_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-soft">Seal code</dt>
          <dd className="font-mono">{v.code}</dd>
          <dt className="text-ink-soft">Project</dt>
          <dd>
            {v.project?.jobNumber} — {v.project?.name}
            <NowNamed number={v.now?.projectJobNumber} title={v.now?.projectName} label="project" />
          </dd>
          <dt className="text-ink-soft">Sheet</dt>
          <dd>
            {v.sheet.number} — {v.sheet.title}
            <NowNamed number={v.now?.sheetNumber} title={v.now?.sheetTitle} label="sheet" />
          </dd>
          <dt className="text-ink-soft">Revision</dt>
          <dd>
            Rev {v.revision?.number}
            {v.revision?.supersededAt ? ` (superseded ${formatUtc(v.revision.supersededAt)})` : ''}
          </dd>
          <dt className="text-ink-soft">Principal</dt>
          <dd>{v.principal?.name}</dd>
          <dt className="text-ink-soft">Licence</dt>
          <dd>
            {v.principal?.licenceNumber}, {v.principal?.jurisdiction}
          </dd>
          <dt className="text-ink-soft">Sealed</dt>
          <dd>{v.sealedAt ? formatUtc(v.sealedAt) : '—'}</dd>
          <dt className="text-ink-soft">{DIGEST_WORDS.seal.label}</dt>
          <dd>
            <span className="font-mono text-xs break-all">{v.digest}</span>
            <span className="block text-xs text-ink-soft">{DIGEST_WORDS.seal.covers}</span>
          </dd>
        </dl>
      ) : null}
    </section>
  );
}
