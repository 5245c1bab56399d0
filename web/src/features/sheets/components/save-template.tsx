import { useState, type FormEvent } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { TextField } from '../../../components/ui/text-field';
import { splitFormError } from '../../../lib/form-errors';
import { useSaveTemplate } from '../api/firm-templates';

const FIELDS = ['name', 'description', 'revisionId'] as const;

/**
 * "Save as firm template": the sheet's draft, or the revision named, copied into the firm's
 * library under a name and description; "new sheet" offers it from then on. Shown to those who
 * may save (the project's authors and admins); the server checks again.
 */
export function SaveTemplate({
  sheetId,
  revision,
  sheetNumber,
}: {
  sheetId: number;
  /** Save this revision as issued; without it, the draft as it was last saved. */
  revision?: { id: number; number: number };
  sheetNumber: string;
}) {
  const [open, setOpen] = useState(false);
  const [saved, setSaved] = useState<string | null>(null);
  return (
    <div className="flex flex-wrap items-baseline gap-2 text-sm print:hidden">
      <Button variant="secondary" onClick={() => setOpen(true)}>
        Save as firm template
      </Button>
      {saved ? (
        <span role="status" className="text-xs text-pass">
          Saved as the firm template “{saved}”.
        </span>
      ) : null}
      {open ? (
        <SaveTemplateDialog
          sheetId={sheetId}
          {...(revision ? { revision } : {})}
          what={revision ? `${sheetNumber} Rev ${revision.number}` : `the draft of ${sheetNumber}`}
          onClose={() => setOpen(false)}
          onSaved={(name) => {
            setSaved(name);
            setOpen(false);
          }}
        />
      ) : null}
    </div>
  );
}

function SaveTemplateDialog({
  sheetId,
  revision,
  what,
  onClose,
  onSaved,
}: {
  sheetId: number;
  revision?: { id: number; number: number };
  what: string;
  onClose: () => void;
  onSaved: (name: string) => void;
}) {
  const save = useSaveTemplate();
  const [name, setName] = useState('');
  const [description, setDescription] = useState('');
  const { fieldErrors, formError } = splitFormError(save.error, FIELDS);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    save.mutate(
      {
        sheetId,
        ...(revision ? { revisionId: revision.id } : {}),
        name: name.trim(),
        description: description.trim(),
      },
      { onSuccess: ({ template }) => onSaved(template.name) },
    );
  };

  return (
    <Dialog title="Save as firm template" onClose={onClose}>
      <p className="-mt-2 mb-3 text-sm text-ink-soft">
        Copies the blocks and settings of {what} into the firm’s library. Numbers typed in it come
        along: check them before each new use.
      </p>
      <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
        <TextField
          label="Template name"
          name="name"
          required
          value={name}
          onChange={(e) => setName(e.target.value)}
          error={fieldErrors.name}
          hint="Unique in the firm, e.g. Steel frame, modal mass participation"
        />
        <TextField
          label="Description"
          name="description"
          value={description}
          onChange={(e) => setDescription(e.target.value)}
          error={fieldErrors.description}
          hint="Optional: when to use it"
        />
        {fieldErrors.revisionId ? (
          <p className="text-sm text-fail">{fieldErrors.revisionId}</p>
        ) : null}
        {formError ? <Alert title="The template was not saved.">{formError}</Alert> : null}
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" busy={save.isPending}>
            Save template
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
