import { useId, type ReactNode } from 'react';

/** A sheet of paper on the desk: a titled, ruled region of a page. */
export function Section({
  title,
  actions,
  children,
}: {
  title: string;
  actions?: ReactNode;
  children: ReactNode;
}) {
  const id = useId();
  return (
    <section
      aria-labelledby={id}
      className="rounded-sm border border-rule bg-paper-sheet px-5 py-4 shadow-sheet"
    >
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2 border-b border-rule pb-2">
        <h2 id={id} className="text-base font-semibold text-ink">
          {title}
        </h2>
        {actions ? <div className="flex items-center gap-2">{actions}</div> : null}
      </div>
      {children}
    </section>
  );
}
