import type { Actor } from '@/lib/auth/roles';
import { commitImport, inspectUpload, type CommitRequest } from '@/lib/plates/import-service';
import { demoFile, demoScreensSetup } from './demo-scenario';
import { fitsCurrent } from './jobs';

/**
 * The commit request for one demo plate export as the import wizard would send it: the manifest's data
 * sheet (or the first) with the mapping inspect guessed, the manifest's plate label unless one is given.
 */
export async function demoCommitRequest(
  biologist: Actor, screens: Record<string, string>, file: string, options: { label?: string } = {},
): Promise<CommitRequest> {
  const { bytes, manifest } = demoFile(file);
  const upload = { screenId: screens[manifest.target]!, bytes, filename: file, mediaType: 'application/octet-stream' };
  const sheets = (await inspectUpload(biologist, upload)).sheets;
  const sheet = sheets.find((s) => s.name === manifest.dataSheet) ?? sheets[0]!;
  return { ...upload, sheet: sheet.name, mapping: sheet.guess.mapping, label: options.label ?? manifest.plate };
}

/** Imports one demo plate export through the import service, with the guessed mapping, and waits for its fits; returns the plate id. */
export async function importDemoPlate(biologist: Actor, screens: Record<string, string>, file: string, options: { label?: string } = {}): Promise<string> {
  const { plateId } = await commitImport(biologist, await demoCommitRequest(biologist, screens, file, options));
  await fitsCurrent(plateId);
  return plateId;
}

/** The plates list's scenario: a fresh database with the demo screens, and three demo plates imported by one biologist. */
export async function threeDemoPlatesSetup(): Promise<{ biologist: Actor; screens: Record<string, string> }> {
  const setup = await demoScreensSetup();
  for (const name of ['nav-96-plate-01.xlsx', 'kv-96-plate-01.csv', 'nav-96-plate-03-noisy.xlsx']) await importDemoPlate(setup.biologist, setup.screens, name);
  return setup;
}
