import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { notFound } from 'next/navigation';
import { ProfileFitsTable } from '@/components/compounds/profile-fits-table';
import { SelectivityList } from '@/components/compounds/selectivity-list';
import { UseDependenceList } from '@/components/compounds/use-dependence-list';
import { DownloadMenu } from '@/components/exports/download-menu';
import { CompoundForecastPanel } from '@/components/forecast/compound-forecast-panel';
import { ForecastCaution } from '@/components/forecast/forecast-caution';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { can } from '@/lib/auth/roles';
import { getCompoundProfilePage, PROFILE_FITS_PAGE_SIZE } from '@/lib/compounds/profile';
import { isAppError } from '@/lib/errors';
import { parseId } from '@/lib/validation/ids';
import { platePageSchema } from '@/lib/validation/plate-filter';

export const metadata: Metadata = { title: 'Compound profile' };

async function load(compoundId: string, page: number) {
  const actor = await requireActor();
  try {
    return { actor, profile: await getCompoundProfilePage(actor, parseId(compoundId, 'compound'), page) };
  } catch (error) {
    if (isAppError(error) && error.code === 'not_found') notFound();
    throw error;
  }
}

export default async function CompoundProfilePage({
  params,
  searchParams,
}: {
  params: Promise<{ compoundId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { actor, profile } = await load(
    (await params).compoundId,
    platePageSchema.parse((await searchParams).page),
  );
  const { compound, fits, potencies, fitCount, approvedCount: approved } = profile;
  const first = (profile.page - 1) * PROFILE_FITS_PAGE_SIZE + 1;
  const last = first + fits.length - 1;
  const pageHref = (page: number) => `/compounds/${compound.id}/profile?page=${page}`;
  const actions = (
    <>
      <AppLink className="gw-button-quiet" href={`/compounds/${compound.id}`}>
        Registry record
      </AppLink>
      {fitCount ? <DownloadMenu kind="compound" id={compound.id} /> : null}
    </>
  );
  return (
    <>
      <PageHeader
        title={`${compound.identifier} profile`}
        intro={`${compound.name || 'No name recorded'}: potency on every target across plates and screens, selectivity, and the forecast at exposure.`}
        actions={actions}
      />
      {!fitCount ? (
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
              {approved} of {fitCount} fits are on approved plates. Results come from approved plates; fits on
              plates not yet approved are shown and marked so, and stand for a target only when it has no
              approved fit.
            </p>
            {profile.pages > 1 ? (
              <div className="flex items-center justify-between text-sm text-ink-700">
                <p aria-live="polite">
                  Fits {first}–{last} of {fitCount}, approved plates first, then newest first (page{' '}
                  {profile.page} of {profile.pages})
                </p>
                <nav aria-label="Pages of fits" className="flex gap-2">
                  {profile.page > 1 ? (
                    <AppLink href={pageHref(profile.page - 1)} className="gw-button-quiet py-1">
                      Previous
                    </AppLink>
                  ) : null}
                  {profile.page < profile.pages ? (
                    <AppLink href={pageHref(profile.page + 1)} className="gw-button-quiet py-1">
                      Next
                    </AppLink>
                  ) : null}
                </nav>
              </div>
            ) : null}
            <ProfileFitsTable fits={fits} standing={new Set(potencies.map((p) => p.fitId))} />
          </section>
          <section aria-labelledby="selectivity-heading" className="space-y-3">
            <h2 id="selectivity-heading" className="text-lg font-semibold">
              Selectivity between targets
            </h2>
            <SelectivityList ratios={profile.selectivity} targetCount={potencies.length} />
          </section>
          {profile.useDependence.length ? (
            <section aria-labelledby="use-dependence-heading" className="space-y-3">
              <h2 id="use-dependence-heading" className="text-lg font-semibold">
                Use dependence
              </h2>
              <UseDependenceList pairs={profile.useDependence} />
            </section>
          ) : null}
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
