import type { ReactNode } from 'react';
import { DownloadMenu } from '@/components/exports/download-menu';
import { PlateFactsLine } from '@/components/plates/plate-facts-line';
import { PlateFitStatus } from '@/components/plates/plate-jobs';
import { PlateTabs } from '@/components/plates/plate-tabs';
import { StateBadge } from '@/components/ui/state-badge';
import { loadPlate } from './plate-header';

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });

export default async function PlateLayout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ plateId: string }>;
}) {
  const { header } = await loadPlate((await params).plateId);
  return (
    <>
      <div className="mb-4 flex flex-wrap items-start justify-between gap-4">
        <div>
          <p className="text-sm text-ink-500">{header.screenName}</p>
          <h1 className="flex items-center gap-3 text-2xl font-semibold">
            Plate {header.label} <StateBadge state={header.state} />
          </h1>
          <p className="mt-1 text-sm text-ink-700">
            {header.format} wells · imported by {header.importedByName} on{' '}
            {when.format(new Date(header.importedAt))} UTC from{' '}
            <span className="font-mono">{header.filename}</span>{' '}
            <span className="font-mono text-xs text-ink-500" title="SHA-256 of the file">
              ({header.sha256.slice(0, 12)}…)
            </span>
          </p>
          <PlateFactsLine facts={header.facts} />
        </div>
        <DownloadMenu kind="plate" id={header.id} />
      </div>
      <PlateTabs plateId={header.id} />
      <PlateFitStatus plateId={header.id} fitsPending={header.fitsPending} />
      {children}
    </>
  );
}
