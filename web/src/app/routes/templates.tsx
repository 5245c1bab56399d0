import { Section } from '../../components/ui/section';
import { paths } from '../../config/paths';
import { FirmTemplatesTable } from '../../features/sheets/components/firm-templates-table';
import { useSignedInUser } from './use-user';
import { useDocumentTitle } from '../../lib/use-document-title';

/** The firm's own sheet templates, beside the built-in ones "new sheet" offers. */
export function TemplatesRoute() {
  useDocumentTitle('Firm templates');
  const user = useSignedInUser();
  return (
    <Section title="Firm templates">
      <p className="mb-3 text-sm text-ink-soft">
        Sheets and revisions saved by the firm’s authors as starting points. “New sheet” offers them
        beside the built-in templates. An admin, or the person who saved a template, may rename or
        delete it.
      </p>
      <FirmTemplatesTable viewer={user} sheetHref={paths.sheet.href} />
    </Section>
  );
}
