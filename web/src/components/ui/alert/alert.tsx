import type { ReactNode } from 'react';

type Tone = 'error' | 'info' | 'success';

const tones: Record<Tone, string> = {
  error: 'border-fail bg-fail-soft text-fail',
  info: 'border-rule-strong bg-paper-deep text-ink',
  success: 'border-pass bg-pass-soft text-pass',
};

/** Errors are announced at once (role="alert"); other notes politely (role="status"). */
export function Alert({
  tone = 'error',
  title,
  children,
  id,
}: {
  tone?: Tone;
  title?: string;
  children: ReactNode;
  id?: string;
}) {
  return (
    <div
      id={id}
      role={tone === 'error' ? 'alert' : 'status'}
      className={`rounded-sm border-l-4 px-3 py-2 text-sm ${tones[tone]}`}
    >
      {title ? <p className="font-semibold">{title}</p> : null}
      <div>{children}</div>
    </div>
  );
}

/** The error state of a query: what failed, the server's words, and a way to try again. */
export function QueryError({
  what,
  error,
  onRetry,
}: {
  what: string;
  error: unknown;
  onRetry?: () => void;
}) {
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <Alert title={`Could not load ${what}.`}>
      <p>{message}</p>
      {onRetry ? (
        <button
          type="button"
          onClick={onRetry}
          className="mt-1 font-medium text-accent-strong underline underline-offset-2"
        >
          Try again
        </button>
      ) : null}
    </Alert>
  );
}
