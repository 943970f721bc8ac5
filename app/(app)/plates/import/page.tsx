import type { Metadata } from 'next';
import { ImportWizard } from '@/components/imports/import-wizard';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requirePageRole } from '@/lib/auth/page-guard';
import { can } from '@/lib/auth/roles';
import { resumeWaitingImport, type ResumedImport } from '@/lib/compounds/waiting-imports';
import { isAppError } from '@/lib/errors';
import { rolesFor } from '@/lib/domain/roles';
import { listTemplates } from '@/lib/plates/templates';
import { listScreens } from '@/lib/screens/list';
import { parseId } from '@/lib/validation/ids';

export const metadata: Metadata = { title: 'Import a plate' };

export default async function ImportPage({ searchParams }: { searchParams: Promise<{ resume?: string }> }) {
  const actor = await requirePageRole(...rolesFor('importPlates'));
  const [screens, templates] = await Promise.all([listScreens(actor), listTemplates(actor)]);
  // ?resume=<draft> opens the person's own import that waited for compounds (lib/compounds/waiting-imports.ts).
  const resumeId = (await searchParams).resume;
  let resume: ResumedImport | undefined;
  let resumeError: string | null = null;
  if (resumeId) {
    try {
      resume = await resumeWaitingImport(actor, parseId(resumeId, 'import draft'));
    } catch (error) {
      if (!isAppError(error)) throw error;
      resumeError = error.message;
    }
  }
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
        <>
          {resumeError ? (
            <p role="alert" className="mb-4 text-sm font-medium text-signal-fail">
              {resumeError}
            </p>
          ) : null}
          <ImportWizard
            key={resume?.draftId ?? 'new'}
            screens={usable}
            templates={templates}
            canRegisterCompounds={can(actor, 'registerCompounds')}
            {...(resume ? { resume } : {})}
          />
        </>
      ) : (
        <EmptyState title="No screen is ready for import">
          An administrator creates a screen and names its targets first.
        </EmptyState>
      )}
    </>
  );
}
