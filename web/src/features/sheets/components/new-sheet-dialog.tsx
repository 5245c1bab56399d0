import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { TextField } from '../../../components/ui/text-field';
import { splitFormError } from '../../../lib/form-errors';
import { useCreateSheet } from '../api/create-sheet';
import { useFirmTemplates, useStartSheetFromTemplate } from '../api/firm-templates';
import { useTemplates } from '../api/get-templates';
import { originText } from '../api/types';

const FIELDS = ['number', 'title', 'subject', 'template'] as const;

const FIRM = 'firm:';

/**
 * Start a sheet: its number, title and subject, empty, from a built-in template or from one of
 * the firm's templates.
 */
export function NewSheetDialog({
  projectId,
  onClose,
  sheetHref,
}: {
  projectId: number;
  onClose: () => void;
  sheetHref: (projectId: number, sheetId: number) => string;
}) {
  const createBuiltIn = useCreateSheet(projectId);
  const createFromFirm = useStartSheetFromTemplate(projectId);
  const templates = useTemplates();
  const firmTemplates = useFirmTemplates();
  const navigate = useNavigate();
  const [number, setNumber] = useState('');
  const [title, setTitle] = useState('');
  const [subject, setSubject] = useState('');
  const [template, setTemplate] = useState('empty');
  const firmId = template.startsWith(FIRM) ? Number(template.slice(FIRM.length)) : null;
  const create = firmId === null ? createBuiltIn : createFromFirm;
  const { fieldErrors, formError } = splitFormError(create.error, FIELDS);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const sheet = {
      number: number.trim(),
      title: title.trim(),
      ...(subject.trim() ? { subject: subject.trim() } : {}),
    };
    const opened = {
      onSuccess: ({ sheet: s }: { sheet: { id: number } }) => navigate(sheetHref(projectId, s.id)),
    };
    if (firmId === null) createBuiltIn.mutate({ ...sheet, template }, opened);
    else createFromFirm.mutate({ ...sheet, templateId: firmId }, opened);
  };

  return (
    <Dialog title="New sheet" onClose={onClose}>
      <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
        <div className="flex gap-3">
          <TextField
            label="Sheet number"
            name="number"
            mono
            required
            value={number}
            onChange={(e) => setNumber(e.target.value)}
            error={fieldErrors.number}
            hint="Unique in the project, e.g. DYN-04"
            className="w-40"
          />
          <TextField
            label="Title"
            name="title"
            required
            value={title}
            onChange={(e) => setTitle(e.target.value)}
            error={fieldErrors.title}
            className="flex-1"
          />
        </div>
        <TextField
          label="Subject"
          name="subject"
          value={subject}
          onChange={(e) => setSubject(e.target.value)}
          error={fieldErrors.subject}
          hint="Optional: what the sheet shows"
        />
        <fieldset className="flex flex-col gap-1">
          <legend className="mb-1 text-sm font-medium">Start from</legend>
          <label className="flex items-start gap-2 text-sm">
            <input
              type="radio"
              name="template"
              value="empty"
              checked={template === 'empty'}
              onChange={() => setTemplate('empty')}
              className="mt-1 accent-accent"
            />
            <span>
              <span className="font-medium">Empty sheet</span>
            </span>
          </label>
          {templates.data?.templates.map((t) => (
            <label key={t.key} className="flex items-start gap-2 text-sm">
              <input
                type="radio"
                name="template"
                value={t.key}
                checked={template === t.key}
                onChange={() => setTemplate(t.key)}
                className="mt-1 accent-accent"
              />
              <span>
                <span className="font-medium">{t.title}</span>
                <span className="block text-xs text-ink-soft">{t.description}</span>
              </span>
            </label>
          ))}
          {firmTemplates.data && firmTemplates.data.templates.length > 0 ? (
            <p className="mt-2 text-xs font-semibold text-ink-soft">The firm’s templates</p>
          ) : null}
          {firmTemplates.data?.templates.map((t) => (
            <label key={t.id} className="flex items-start gap-2 text-sm">
              <input
                type="radio"
                name="template"
                value={`${FIRM}${t.id}`}
                checked={template === `${FIRM}${t.id}`}
                onChange={() => setTemplate(`${FIRM}${t.id}`)}
                className="mt-1 accent-accent"
              />
              <span>
                <span className="font-medium">{t.name}</span>
                {t.description ? (
                  <span className="block text-xs text-ink-soft">{t.description}</span>
                ) : null}
                <span className="block text-xs text-ink-faint">
                  From {originText(t.origin)}, saved by {t.createdBy.name}
                </span>
              </span>
            </label>
          ))}
          {firmTemplates.isError ? (
            <p className="text-xs text-fail">
              The firm’s templates could not be loaded: {firmTemplates.error.message}
            </p>
          ) : null}
          {templates.isError ? (
            <p className="text-xs text-fail">
              The templates could not be loaded: {templates.error.message}
            </p>
          ) : null}
          {fieldErrors.template ? (
            <p className="text-sm text-fail">{fieldErrors.template}</p>
          ) : null}
        </fieldset>
        {formError ? <Alert title="The sheet was not created.">{formError}</Alert> : null}
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" busy={create.isPending}>
            Create sheet
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
