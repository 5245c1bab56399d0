import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { Alert } from '../../../components/ui/alert';
import { splitFormError } from '../../../lib/form-errors';

export type ProjectFields = { jobNumber: string; name: string; client: string; site: string };

const FIELDS = ['jobNumber', 'name', 'client', 'site'] as const;

/** The four details of a job, used both to start a project and to correct one. */
export function ProjectForm({
  label,
  submitLabel,
  initial,
  busy,
  error,
  onSubmit,
  onCancel,
}: {
  label: string;
  submitLabel: string;
  initial?: ProjectFields;
  busy: boolean;
  error: unknown;
  onSubmit: (fields: ProjectFields) => void;
  onCancel?: () => void;
}) {
  const [fields, setFields] = useState<ProjectFields>(
    initial ?? { jobNumber: '', name: '', client: '', site: '' },
  );
  const { fieldErrors, formError } = splitFormError(error, FIELDS);
  const set = (key: keyof ProjectFields) => (e: { target: { value: string } }) =>
    setFields((f) => ({ ...f, [key]: e.target.value }));

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    onSubmit({
      jobNumber: fields.jobNumber.trim(),
      name: fields.name.trim(),
      client: fields.client.trim(),
      site: fields.site.trim(),
    });
  }

  return (
    <form onSubmit={submit} noValidate aria-label={label} className="flex flex-col gap-3">
      <div className="grid gap-3 sm:grid-cols-[10rem_1fr]">
        <TextField
          label="Job no."
          name="jobNumber"
          mono
          required
          value={fields.jobNumber}
          onChange={set('jobNumber')}
          error={fieldErrors.jobNumber}
        />
        <TextField
          label="Name"
          name="name"
          required
          value={fields.name}
          onChange={set('name')}
          error={fieldErrors.name}
        />
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          label="Client"
          name="client"
          required
          value={fields.client}
          onChange={set('client')}
          error={fieldErrors.client}
        />
        <TextField
          label="Site"
          name="site"
          required
          value={fields.site}
          onChange={set('site')}
          error={fieldErrors.site}
        />
      </div>
      {formError ? <Alert>{formError}</Alert> : null}
      <div className="flex gap-2">
        <Button type="submit" busy={busy}>
          {submitLabel}
        </Button>
        {onCancel ? (
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}
