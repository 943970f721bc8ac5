import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { ScreenForm } from '@/components/screens/screen-form';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { can } from '@/lib/auth/roles';
import { createScreenAction } from '../actions';
import { PRESET_OPTIONS } from '../presets';

export const metadata: Metadata = { title: 'New screen' };

export default async function NewScreenPage() {
  const actor = await requireActor();
  if (!can(actor, 'manageScreens')) notFound();
  return (
    <>
      <PageHeader
        title="New screen"
        intro="A campaign: the neuron preset its forecasts use, QC limits and exposures. Targets are added next."
      />
      <section className="gw-card p-5">
        <ScreenForm action={createScreenAction} presets={PRESET_OPTIONS} submitLabel="Create screen" />
      </section>
    </>
  );
}
