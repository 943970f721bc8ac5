import type { Metadata } from 'next';
import { ImportWizard } from '@/components/imports/import-wizard';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requirePageRole } from '@/lib/auth/page-guard';
import { rolesFor } from '@/lib/domain/roles';
import { listTemplates } from '@/lib/plates/templates';
import { listScreens } from '@/lib/screens/list';

export const metadata: Metadata = { title: 'Import a plate' };

export default async function ImportPage() {
  const actor = await requirePageRole(...rolesFor('importPlates'));
  const [screens, templates] = await Promise.all([listScreens(actor), listTemplates(actor)]);
  const usable = screens
    .filter((s) => s.targets.length > 0)
    .map((s) => ({ id: s.id, name: s.name, targets: s.targets.map((t) => t.name) }));
  return (
    <>
      <PageHeader
        title="Import a plate"
        intro="Read the instrument's export, map its columns once per layout, check every row, then store the plate with its QC and fits."
      />
      {usable.length ? (
        <ImportWizard screens={usable} templates={templates} />
      ) : (
        <EmptyState title="No screen is ready for import">
          An administrator creates a screen and names its targets first.
        </EmptyState>
      )}
    </>
  );
}
