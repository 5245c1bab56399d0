import { useId } from 'react';

export interface FilterBarProps {
  label: string;
  placeholder: string;
  value: string;
  onChange: (value: string) => void;
  /** How many rows the filter lets through, and how many there are. */
  shown: number;
  total: number;
  /** "3 people", "1 project": the count in words. */
  countWords: (n: number) => string;
  /** Tailwind width of the input, e.g. `w-72`. */
  widthClass?: string;
}

/** A labelled search box above a table, with the live count of the rows it shows. */
export function FilterBar({
  label,
  placeholder,
  value,
  onChange,
  shown,
  total,
  countWords,
  widthClass = 'w-72',
}: FilterBarProps) {
  const id = useId();
  return (
    <div className="mb-3 flex flex-wrap items-end gap-3">
      <div className="flex flex-col gap-1">
        <label htmlFor={id} className="text-sm font-medium">
          {label}
        </label>
        <input
          id={id}
          type="search"
          value={value}
          onChange={(e) => onChange(e.target.value)}
          placeholder={placeholder}
          className={`${widthClass} rounded-sm border border-rule-strong bg-paper-sheet px-2.5 py-1.5`}
        />
      </div>
      <p className="pb-2 text-sm text-ink-soft" role="status">
        {shown === total ? countWords(total) : `${shown} of ${countWords(total)}`}
      </p>
    </div>
  );
}
