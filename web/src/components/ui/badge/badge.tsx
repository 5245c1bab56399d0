import type { ReactNode } from 'react';

export function Badge({
  children,
  tone = 'plain',
}: {
  children: ReactNode;
  tone?: 'plain' | 'accent';
}) {
  return (
    <span
      className={`inline-block rounded-sm border px-1.5 py-0.5 text-xs font-medium ${
        tone === 'accent'
          ? 'border-accent bg-accent-soft text-accent-strong'
          : 'border-rule-strong bg-paper-sheet text-ink-soft'
      }`}
    >
      {children}
    </span>
  );
}
