import type { ReactNode, TdHTMLAttributes, ThHTMLAttributes } from 'react';

/** A ruled table in the sheet style: hairlines between rows, no zebra stripes. */
export function Table({ caption, children }: { caption: string; children: ReactNode }) {
  return (
    <div className="overflow-x-auto">
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
