import type { Actor } from '@/lib/auth/roles';
import { commitImport, inspectUpload } from '@/lib/plates/import-service';
import { demoFile } from './demo-scenario';
import { fitsCurrent } from './jobs';

/** Imports one demo plate export through the import service, with the guessed mapping, and waits for its fits; returns the plate id. */
export async function importDemoPlate(biologist: Actor, screens: Record<string, string>, file: string): Promise<string> {
  const { bytes, manifest } = demoFile(file);
  const upload = { screenId: screens[manifest.target]!, bytes, filename: file, mediaType: 'application/octet-stream' };
  const sheets = (await inspectUpload(biologist, upload)).sheets;
  const sheet = sheets.find((s) => s.name === manifest.dataSheet) ?? sheets[0]!;
  const { plateId } = await commitImport(biologist, { ...upload, sheet: sheet.name, mapping: sheet.guess.mapping, label: manifest.plate });
  await fitsCurrent(plateId);
  return plateId;
}
