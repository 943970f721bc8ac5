import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { notFound } from 'next/navigation';
import { ProfileFitsTable } from '@/components/compounds/profile-fits-table';
import { SelectivityList } from '@/components/compounds/selectivity-list';
import { DownloadMenu } from '@/components/exports/download-menu';
import { CompoundForecastPanel } from '@/components/forecast/compound-forecast-panel';
import { ForecastCaution } from '@/components/forecast/forecast-caution';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { can } from '@/lib/auth/roles';
import { getCompoundProfile } from '@/lib/compounds/profile';
import { isAppError } from '@/lib/errors';
import { parseId } from '@/lib/validation/ids';

export const metadata: Metadata = { title: 'Compound profile' };

async function load(compoundId: string) {
  const actor = await requireActor();
  try {
    return { actor, profile: await getCompoundProfile(actor, parseId(compoundId, 'compound')) };
  } catch (error) {
    if (isAppError(error) && error.code === 'not_found') notFound();
    throw error;
  }
}

export default async function CompoundProfilePage({ params }: { params: Promise<{ compoundId: string }> }) {
  const { actor, profile } = await load((await params).compoundId);
  const { compound, fits, potencies } = profile;
  const approved = fits.filter((f) => f.approved).length;
  const actions = (
    <>
      <AppLink className="gw-button-quiet" href={`/compounds/${compound.id}`}>
        Registry record
      </AppLink>
      {fits.length ? <DownloadMenu kind="compound" id={compound.id} /> : null}
    </>
  );
  return (
    <>
      <PageHeader
        title={`${compound.identifier} profile`}
        intro={`${compound.name || 'No name recorded'}: potency on every target across plates and screens, selectivity, and the forecast at exposure.`}
        actions={actions}
      />
      {!fits.length ? (
        <EmptyState title="No fits yet">
          {compound.identifier} has not been on an imported plate. Its fits appear here once a plate that
          holds it is imported
          {can(actor, 'importPlates') ? (
            <>
              :{' '}
              <AppLink className="underline" href="/plates/import">
                import a plate
              </AppLink>
              .
            </>
          ) : (
            ' by a biologist.'
          )}
        </EmptyState>
      ) : (
        <div className="space-y-8">
          <section aria-labelledby="potency-heading" className="space-y-3">
            <h2 id="potency-heading" className="text-lg font-semibold">
              Potency across plates
            </h2>
            <p className="max-w-3xl text-sm text-ink-700">
              {approved} of {fits.length} fits are on approved plates. Results come from approved plates; fits
              on plates not yet approved are shown and marked so, and stand for a target only when it has no
              approved fit.
            </p>
            <ProfileFitsTable fits={fits} standing={new Set(potencies.map((p) => p.fitId))} />
          </section>
          <section aria-labelledby="selectivity-heading" className="space-y-3">
            <h2 id="selectivity-heading" className="text-lg font-semibold">
              Selectivity between targets
            </h2>
            <SelectivityList ratios={profile.selectivity} targetCount={potencies.length} />
          </section>
          <section aria-labelledby="profile-forecast-heading" className="space-y-3">
            <h2 id="profile-forecast-heading" className="text-lg font-semibold">
              Forecast at exposure
            </h2>
            <p className="max-w-3xl text-sm text-ink-700">
              The block of every target at once, each from the fit that stands for it above, in a model neuron
              at a screen’s exposures of interest.
            </p>
            <ForecastCaution />
            <CompoundForecastPanel compoundId={compound.id} screens={profile.screens} />
          </section>
        </div>
      )}
    </>
  );
}
