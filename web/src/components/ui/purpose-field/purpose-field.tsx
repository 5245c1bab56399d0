import { useId } from 'react';

/**
 * The optional purpose a checker or principal states for a revision ("For construction"); empty
 * keeps the one it has, which the label names.
 */
export function PurposeField({
  label,
  current,
  value,
  onChange,
}: {
  /** "Checked for", "Sealed for". */
  label: string;
  /** What the revision is for now. */
  current: string;
  value: string;
  onChange: (value: string) => void;
}) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-xs font-medium">
        {label} (leave empty to keep “{current}”)
      </label>
      <input
        id={id}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        placeholder="For construction"
        maxLength={500}
        className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1 text-sm"
      />
    </div>
  );
}
