import type { Actor } from '@/lib/auth/roles';
import { commitImport, inspectUpload } from '@/lib/plates/import-service';
import { makeActor } from './actors';
import { demoFile, makeDemoScreens } from './demo-scenario';
import { fitsCurrent } from './jobs';

export const PASSWORD = 'test-password-123';

export interface SignoffCast {
  admin: Actor;
  chemist: Actor;
  biologist: Actor;
  approver: Actor;
  approver2: Actor;
  plateId: string;
}

/** Real users of each role and one demo plate imported by the biologist, as the sign-off tests start. */
export async function signoffCast(file = 'nav-96-plate-01.xlsx'): Promise<SignoffCast> {
  const admin = await makeActor(['admin']);
  const chemist = await makeActor(['chemist']);
  const screens = await makeDemoScreens(admin, chemist);
  const biologist = await makeActor(['biologist']);
  const approver = await makeActor(['approver']);
  const approver2 = await makeActor(['approver']);
  const { bytes, manifest } = demoFile(file);
  const upload = { screenId: screens[manifest.target]!, bytes, filename: file, mediaType: 'application/octet-stream' };
  const sheet = (await inspectUpload(biologist, upload)).sheets.find((s) => s.name === manifest.dataSheet)!;
  const { plateId } = await commitImport(biologist, { ...upload, sheet: sheet.name, mapping: sheet.guess.mapping, label: manifest.plate });
  await fitsCurrent(plateId);
  return { admin, chemist, biologist, approver, approver2, plateId };
}
