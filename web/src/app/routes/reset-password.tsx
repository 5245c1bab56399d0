import { useEffect, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { paths } from '../../config/paths';
import { ResetPasswordForm } from '../../features/auth/components/reset-password-form';
import { Caution } from '../layout/caution';
import { Wordmark } from '../layout/wordmark';

// The token travels in the link's fragment (#…): browsers never send it to a server or in a
// Referer header, so it stays out of logs.
function tokenFromLink(): string {
  return window.location.hash.replace(/^#/, '');
}

export function ResetPasswordRoute() {
  const [token] = useState(tokenFromLink);
  const [doneFor, setDoneFor] = useState<string | null>(null);

  useEffect(() => {
    document.title = 'Set a new password · Modewright';
    // The token is no longer needed in the address bar once read.
    if (window.location.hash) window.history.replaceState(null, '', window.location.pathname);
  }, []);

  return (
    <div className="flex min-h-screen flex-col">
      <main className="flex flex-1 items-center justify-center px-6 py-12">
        <div className="w-full max-w-sm">
          <div className="mb-6">
            <Wordmark large />
          </div>
          <div className="rounded-sm border border-rule bg-paper-sheet px-6 py-5 shadow-sheet">
            <h1 className="mb-4 text-lg font-semibold">Set a new password</h1>
            {doneFor ? (
              <Alert tone="success">
                The password of {doneFor} is set, and every earlier session has ended.{' '}
                <Link to={paths.signIn.href()} className="text-accent-strong underline">
                  Sign in
                </Link>{' '}
                with it now. A principal's signing key was locked under the old password: it is
                retired, earlier seals still verify, and the next seal makes a new key.
              </Alert>
            ) : token ? (
              <ResetPasswordForm token={token} onDone={setDoneFor} />
            ) : (
              <Alert>
                This page needs the link from the reset e-mail. Open the link exactly as it was
                mailed, or ask your administrator to send a new one.
              </Alert>
            )}
          </div>
        </div>
      </main>
      <footer className="border-t border-rule px-6 py-3">
        <div className="mx-auto max-w-6xl">
          <Caution />
        </div>
      </footer>
    </div>
  );
}
