import type { Actor } from '@/lib/auth/roles';
import { makeActor } from './actors';
import { importDemoPlate } from './demo-plates';
import { makeDemoScreens } from './demo-scenario';

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
  const plateId = await importDemoPlate(biologist, screens, file);
  return { admin, chemist, biologist, approver, approver2, plateId };
}
