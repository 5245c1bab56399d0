import type { ReactNode, TdHTMLAttributes, ThHTMLAttributes } from 'react';

/**
 * A ruled table in the sheet style: hairlines between rows, no zebra stripes. A wide table scrolls
 * sideways inside its own box; with `scrollable`, that box is a named region a keyboard can focus
 * and scroll, and narrow screens are told it scrolls.
 */
export function Table({
  caption,
  children,
  scrollable = false,
}: {
  caption: string;
  children: ReactNode;
  scrollable?: boolean;
}) {
  if (scrollable) {
    return (
      <div className="min-w-0">
        <div
          className="relative max-w-full overflow-x-auto overscroll-x-contain"
          role="region"
          aria-label={`${caption} (scrolls sideways)`}
          tabIndex={0}
        >
          <table className="w-full border-collapse text-left text-sm">
            <caption className="sr-only">{caption}</caption>
            {children}
          </table>
        </div>
        <p className="mt-0.5 text-xs text-ink-faint sm:hidden" aria-hidden="true">
          Scroll the table sideways for more columns.
        </p>
      </div>
    );
  }
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        {children}
      </table>
    </div>
  );
}

/**
 * A column heading in small capitals; `caps={false}` for headings that carry symbols and units
 * (f (Hz), ω (rad/s)), which capitals would turn into other symbols (Ω) and wrong units (HZ).
 */
export function Th({
  className = '',
  caps = true,
  ...rest
}: ThHTMLAttributes<HTMLTableCellElement> & { caps?: boolean }) {
  return (
    <th
      scope="col"
      className={`border-b border-ink/70 px-3 py-2 text-xs font-semibold text-ink-soft ${caps ? 'tracking-wide uppercase' : ''} ${className}`}
      {...rest}
    />
  );
}

export function Td({ className = '', ...rest }: TdHTMLAttributes<HTMLTableCellElement>) {
  return <td className={`border-b border-rule px-3 py-2 align-top ${className}`} {...rest} />;
}
