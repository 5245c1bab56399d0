import { useId } from 'react';

export type CheckboxOption = { value: string; label: string };

export type CheckboxGroupProps = {
  legend: string;
  name: string;
  options: readonly CheckboxOption[];
  value: readonly string[];
  onChange: (value: string[]) => void;
  error?: string | undefined;
  disabled?: boolean;
  /** Hide the legend visually (it stays for screen readers), e.g. inside a table row. */
  legendHidden?: boolean;
  /** Move the focus to the first box when the group appears (an inline editor opening). */
  autoFocusFirst?: boolean;
};

export function CheckboxGroup({
  legend,
  name,
  options,
  value,
  onChange,
  error,
  disabled = false,
  legendHidden = false,
  autoFocusFirst = false,
}: CheckboxGroupProps) {
  const id = useId();
  const errorId = `${id}-error`;
  return (
    <fieldset
      className="flex flex-col gap-1"
      aria-invalid={error ? true : undefined}
      aria-describedby={error ? errorId : undefined}
      disabled={disabled}
    >
      <legend className={legendHidden ? 'sr-only' : 'mb-1 text-sm font-medium text-ink'}>
        {legend}
      </legend>
      <div className="flex flex-wrap gap-x-4 gap-y-1">
        {options.map((option, index) => (
          <label key={option.value} className="inline-flex items-center gap-1.5 text-sm">
            <input
              type="checkbox"
              name={name}
              value={option.value}
              autoFocus={autoFocusFirst && index === 0}
              checked={value.includes(option.value)}
              onChange={(event) =>
                onChange(
                  event.target.checked
                    ? [...value, option.value]
                    : value.filter((v) => v !== option.value),
                )
              }
              className="size-4 accent-accent"
            />
            {option.label}
          </label>
        ))}
      </div>
      {error ? (
        <p id={errorId} className="text-sm text-fail">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
