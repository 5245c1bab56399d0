import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { Alert, QueryError } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { Spinner } from '../../../components/ui/spinner';
import { Table, Td, Th } from '../../../components/ui/table';
import { TextField } from '../../../components/ui/text-field';
import { formatUtc } from '../../../lib/format';
import { splitFormError } from '../../../lib/form-errors';
import { useDeleteTemplate, useFirmTemplates, useUpdateTemplate } from '../api/firm-templates';
import { originText, type FirmTemplate } from '../api/types';

type Viewer = { id: number; isAdmin: boolean };

/**
 * The firm's templates with where each came from; an admin, or the person who saved one, may
 * change its name and description or delete it.
 */
export function FirmTemplatesTable({
  viewer,
  sheetHref,
}: {
  viewer: Viewer;
  sheetHref: (projectId: number, sheetId: number) => string;
}) {
  const query = useFirmTemplates();
  if (query.isPending) return <Spinner label="Loading the firm’s templates…" />;
  if (query.isError) {
    return (
      <QueryError what="the firm’s templates" error={query.error} onRetry={() => query.refetch()} />
    );
  }
  const templates = query.data.templates;
  if (templates.length === 0) {
    return (
      <EmptyState title="The firm has no templates of its own yet.">
        Open a sheet or a revision and choose “Save as firm template”; new sheets can then start
        from it.
      </EmptyState>
    );
  }
  return (
    <Table caption="Firm templates">
      <thead>
        <tr>
          <Th>Name</Th>
          <Th>From</Th>
          <Th>Saved by</Th>
          <Th>
            <span className="sr-only">Actions</span>
          </Th>
        </tr>
      </thead>
      <tbody>
        {templates.map((t) => (
          <TemplateRow
            key={t.id}
            template={t}
            mayManage={viewer.isAdmin || viewer.id === t.createdBy.id}
            sheetHref={sheetHref}
          />
        ))}
      </tbody>
    </Table>
  );
}

function TemplateRow({
  template: t,
  mayManage,
  sheetHref,
}: {
  template: FirmTemplate;
  mayManage: boolean;
  sheetHref: (projectId: number, sheetId: number) => string;
}) {
  const [editing, setEditing] = useState(false);
  const remove = useDeleteTemplate(t.id);
  const from = originText(t.origin);
  return (
    <tr>
      <Td>
        {editing ? (
          <EditTemplate template={t} onDone={() => setEditing(false)} />
        ) : (
          <>
            <span className="font-medium">{t.name}</span>
            {t.description ? (
              <span className="block text-xs text-ink-soft">{t.description}</span>
            ) : null}
          </>
        )}
      </Td>
      <Td className="text-xs">
        {t.origin.projectId !== null && t.origin.sheetId !== null ? (
          <Link
            to={sheetHref(t.origin.projectId, t.origin.sheetId)}
            className="text-accent-strong hover:underline"
          >
            {from}
          </Link>
        ) : (
          `${from} (no longer there)`
        )}
      </Td>
      <Td className="text-xs">
        {t.createdBy.name}
        <span className="block text-ink-faint">{formatUtc(t.createdAt)}</span>
      </Td>
      <Td className="text-right whitespace-nowrap">
        {mayManage && !editing ? (
          <span className="inline-flex gap-1">
            <Button variant="quiet" onClick={() => setEditing(true)}>
              Edit<span className="sr-only"> {t.name}</span>
            </Button>
            <Button
              variant="danger"
              busy={remove.isPending}
              onClick={() => {
                if (
                  window.confirm(`Delete the firm template “${t.name}”? Sheets made from it stay.`)
                )
                  remove.mutate();
              }}
            >
              Delete<span className="sr-only"> {t.name}</span>
            </Button>
          </span>
        ) : null}
        {remove.isError ? (
          <span role="alert" className="block text-xs text-fail">
            {remove.error.message}
          </span>
        ) : null}
      </Td>
    </tr>
  );
}

function EditTemplate({ template, onDone }: { template: FirmTemplate; onDone: () => void }) {
  const update = useUpdateTemplate(template.id);
  const [name, setName] = useState(template.name);
  const [description, setDescription] = useState(template.description);
  const { fieldErrors, formError } = splitFormError(update.error, ['name', 'description']);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    update.mutate({ name: name.trim(), description: description.trim() }, { onSuccess: onDone });
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-2" noValidate>
      <TextField
        label="Template name"
        name="name"
        value={name}
        onChange={(e) => setName(e.target.value)}
        error={fieldErrors.name}
      />
      <TextField
        label="Description"
        name="description"
        value={description}
        onChange={(e) => setDescription(e.target.value)}
        error={fieldErrors.description}
      />
      {formError ? <Alert title="The template was not changed.">{formError}</Alert> : null}
      <span className="flex gap-2">
        <Button type="submit" busy={update.isPending}>
          Save changes
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </span>
    </form>
  );
}
