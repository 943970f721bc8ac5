import type { Metadata } from 'next';
import { VerificationMaps } from '@/components/plates/verification-maps';
import { PlateTimeline } from '@/components/signoff/plate-timeline';
import { SignoffPanel } from '@/components/signoff/signoff-panel';
import { can } from '@/lib/auth/roles';
import { plateHistory } from '@/lib/signoff/history';
import { signoffPanel } from '@/lib/signoff/panel';
import { loadPlate } from '../plate-header';
import { signPlateStepAction } from '../signoff/actions';

export const metadata: Metadata = { title: 'Sign-off and history' };

export default async function PlateSignoffPage({ params }: { params: Promise<{ plateId: string }> }) {
  const { actor, header } = await loadPlate((await params).plateId);
  const [panel, history] = await Promise.all([
    signoffPanel(actor, header.id),
    plateHistory(actor, header.id),
  ]);
  const maps = <VerificationMaps plateId={header.id} format={header.format} />;
  // Someone who verifies a plate waiting for it reads the compound map first; everyone else after sign-off.
  const verifying = header.state === 'imported' && can(actor, 'verifyCompoundMap');
  return (
    <div className="space-y-10">
      {verifying ? maps : null}
      <div className="grid items-start gap-8 lg:grid-cols-[minmax(0,1.1fr)_minmax(0,1fr)]">
        <SignoffPanel data={panel} action={signPlateStepAction} />
        <PlateTimeline entries={history} />
      </div>
      {verifying ? null : maps}
    </div>
  );
}
