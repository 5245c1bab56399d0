import { useId, type InputHTMLAttributes } from 'react';

export type TextFieldProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'id'> & {
  label: string;
  name: string;
  error?: string | undefined;
  hint?: string | undefined;
  mono?: boolean;
};

/** A labelled input; a server message about this input is shown under it and announced. */
export function TextField({
  label,
  name,
  error,
  hint,
  mono = false,
  className = '',
  'aria-invalid': ariaInvalid,
  'aria-describedby': ariaDescribedBy,
  ...rest
}: TextFieldProps) {
  const id = useId();
  const errorId = `${id}-error`;
  const hintId = `${id}-hint`;
  const describedBy = [hint ? hintId : null, error ? errorId : null, ariaDescribedBy ?? null]
    .filter(Boolean)
    .join(' ');
  const invalid = Boolean(error) || ariaInvalid === true || ariaInvalid === 'true';
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
      </label>
      <input
        id={id}
        name={name}
        aria-invalid={invalid || undefined}
        aria-describedby={describedBy || undefined}
        className={`rounded-sm border bg-paper-sheet px-2.5 py-1.5 text-ink placeholder:text-ink-faint ${
          invalid ? 'border-fail' : 'border-rule-strong'
        } ${mono ? 'font-mono' : ''}`}
        {...rest}
      />
      {hint ? (
        <p id={hintId} className="text-xs text-ink-faint">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={errorId} className="text-sm text-fail">
          {error}
        </p>
      ) : null}
    </div>
  );
}
