import { Link, useNavigate, useParams } from 'react-router-dom';
import { paths } from '../../config/paths';
import { CAUTION } from '../../config/words';
import { VerifyCodeForm, VerifyResult } from '../../features/verify/components/verify-page';
import { Wordmark } from '../layout/wordmark';

/** Public: anyone checks a seal without signing in (DESIGN §7). */
export function VerifyRoute() {
  const { code } = useParams();
  const navigate = useNavigate();
  return (
    <div className="min-h-screen bg-paper">
      <header className="border-b border-rule bg-paper-sheet">
        <div className="mx-auto flex max-w-3xl items-center justify-between px-6 py-3">
          <Link to={paths.verify.href()} aria-label="Modewright, verify a seal">
            <Wordmark />
          </Link>
          <span className="text-sm text-ink-soft">Seal verification — no sign-in needed</span>
        </div>
      </header>
      <main id="main" className="mx-auto flex max-w-3xl flex-col gap-6 px-6 py-8">
        <h1 className="text-xl font-semibold text-ink">Verify a sealed calculation</h1>
        <p className="text-sm text-ink-soft">
          The server recomputes the SHA-256 digest of the stored revision and checks the Ed25519
          signature against the principal’s public key.
        </p>
        <VerifyCodeForm
          key={code ?? ''}
          initial={code ?? ''}
          onSubmit={(c) => navigate(paths.verify.href(c))}
        />
        {code ? <VerifyResult code={code} /> : null}
        <p className="border-t border-rule pt-3 text-xs text-ink-faint">{CAUTION}</p>
      </main>
    </div>
  );
}
