import { TextField } from '../text-field';

/**
 * The optional purpose a checker or principal states for a revision ("For construction"); empty
 * keeps the one it has, which the hint names. Laid out as every other field of the form.
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
  return (
    <TextField
      label={label}
      name="purpose"
      hint={`Leave empty to keep “${current}”.`}
      value={value}
      onChange={(e) => onChange(e.target.value)}
      placeholder="For construction"
      maxLength={500}
    />
  );
}
