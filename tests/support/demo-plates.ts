import type { Actor } from '@/lib/auth/roles';
import { commitImport, inspectUpload, type CommitRequest } from '@/lib/plates/import-service';
import { demoFile, demoScreensSetup } from './demo-scenario';
import { fitsCurrent } from './jobs';

/**
 * The commit request for one demo plate export as the import wizard sends it: the draft inspect kept, the
 * manifest's data sheet (or the first) with the mapping inspect guessed, the manifest's plate label unless
 * one is given. With `{ source: 'file' }` the request sends the file itself instead, as scripts may.
 */
export async function demoCommitRequest(
  biologist: Actor,
  screens: Record<string, string>,
  file: string,
  options: { label?: string; source?: 'draft' | 'file' } = {},
): Promise<CommitRequest> {
  const { bytes, manifest } = demoFile(file);
  const upload = {
    screenId: screens[manifest.target]!,
    bytes,
    filename: file,
    mediaType: 'application/octet-stream',
  };
  const inspection = await inspectUpload(biologist, upload);
  const sheet = inspection.sheets.find((s) => s.name === manifest.dataSheet) ?? inspection.sheets[0]!;
  const choice = { sheet: sheet.name, mapping: sheet.guess.mapping, label: options.label ?? manifest.plate };
  // A file already stored for the screen gets no draft: its request sends the file, and the commit refuses it.
  if (options.source === 'file' || !inspection.draftId) return { ...upload, ...choice };
  return { draftId: inspection.draftId, ...choice };
}

/** Imports one demo plate export through the import service, with the guessed mapping, and waits for its fits; returns the plate id. */
export async function importDemoPlate(
  biologist: Actor,
  screens: Record<string, string>,
  file: string,
  options: { label?: string } = {},
): Promise<string> {
  const { plateId } = await commitImport(
    biologist,
    await demoCommitRequest(biologist, screens, file, options),
  );
  await fitsCurrent(plateId);
  return plateId;
}

/** The plates list's scenario: a fresh database with the demo screens, and three demo plates imported by one biologist. */
export async function threeDemoPlatesSetup(): Promise<{ biologist: Actor; screens: Record<string, string> }> {
  const setup = await demoScreensSetup();
  for (const name of ['nav-96-plate-01.xlsx', 'kv-96-plate-01.csv', 'nav-96-plate-03-noisy.xlsx'])
    await importDemoPlate(setup.biologist, setup.screens, name);
  return setup;
}
