import { useId, useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/alert';
import { splitFormError } from '../../../lib/form-errors';
import { useCreateRemark } from '../api/remark-mutations';
import { REMARK_TYPE_LABELS, type RemarkType } from '../api/types';

/** The checker's remark on one line of a block (line 0: the block as a whole). */
export function RemarkForm({
  revisionId,
  blockId,
  blockLabel,
  line,
  onDone,
}: {
  revisionId: number;
  blockId: string;
  blockLabel: string;
  line: number;
  onDone: () => void;
}) {
  const id = useId();
  const [type, setType] = useState<RemarkType>('query');
  const [text, setText] = useState('');
  const create = useCreateRemark(revisionId);
  const { fieldErrors, formError } = splitFormError(create.error, ['type', 'text', 'line']);

  function submit(event: FormEvent) {
    event.preventDefault();
    create.mutate({ blockId, line, type, text }, { onSuccess: onDone });
  }

  const where = line === 0 ? `${blockLabel} as a whole` : `${blockLabel}, line ${line}`;
  return (
    <form
      onSubmit={submit}
      aria-label={`Remark on ${where}`}
      className="my-2 flex flex-col gap-2 rounded-sm border border-accent bg-accent-soft/40 p-3 font-sans"
    >
      <p className="text-sm font-medium text-ink">Remark on {where}</p>
      <div className="flex flex-wrap items-end gap-3">
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-type`} className="text-sm font-medium text-ink">
            Type
          </label>
          <select
            id={`${id}-type`}
            value={type}
            onChange={(e) => setType(e.target.value as RemarkType)}
            className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1.5 text-sm"
          >
            {(Object.keys(REMARK_TYPE_LABELS) as RemarkType[]).map((t) => (
              <option key={t} value={t}>
                {REMARK_TYPE_LABELS[t]}
              </option>
            ))}
          </select>
        </div>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-text`} className="text-sm font-medium text-ink">
          Remark
        </label>
        <textarea
          id={`${id}-text`}
          value={text}
          onChange={(e) => setText(e.target.value)}
          rows={3}
          aria-invalid={fieldErrors.text ? true : undefined}
          className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1.5 text-sm"
        />
        {fieldErrors.text ? <p className="text-sm text-fail">{fieldErrors.text}</p> : null}
      </div>
      {formError || fieldErrors.type || fieldErrors.line ? (
        <Alert>{formError ?? fieldErrors.type ?? fieldErrors.line}</Alert>
      ) : null}
      <div className="flex gap-2">
        <Button type="submit" busy={create.isPending}>
          Add remark
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
