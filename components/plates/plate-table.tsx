import { AppLink } from '@/components/ui/app-link';
import { DataTable } from '@/components/ui/data-table';
import { StateBadge } from '@/components/ui/state-badge';
import type { PlateSummary } from '@/lib/plates/list';

const dateFormat = new Intl.DateTimeFormat('en-GB', {
  dateStyle: 'medium',
  timeStyle: 'short',
  timeZone: 'UTC',
});

/** Plates in a table; each label links to the plate (or to where `linkTo` says, e.g. its sign-off). */
export function PlateTable({
  plates,
  caption,
  linkTo = (p) => `/plates/${p.id}`,
}: {
  plates: PlateSummary[];
  caption: string;
  linkTo?: (plate: PlateSummary) => string;
}) {
  return (
    <DataTable
      caption={caption}
      rows={plates}
      rowKey={(plate) => plate.id}
      columns={[
        {
          header: 'Plate',
          cell: (p) => (
            <AppLink
              href={linkTo(p)}
              className="font-medium text-lagoon-700 underline-offset-2 hover:underline"
            >
              {p.label}
            </AppLink>
          ),
        },
        { header: 'Screen', cell: (p) => p.screenName },
        { header: 'Format', cell: (p) => `${p.format} wells`, align: 'right' },
        { header: 'State', cell: (p) => <StateBadge state={p.state} /> },
        {
          header: 'Wells failing QC',
          cell: (p) => `${p.failingWellCount} of ${p.wellCount}`,
          align: 'right',
        },
        {
          header: 'Plate QC',
          cell: (p) =>
            p.failingTargets ? (
              <span className="font-medium text-signal-fail">Z′ below limit</span>
            ) : (
              <span className="text-signal-pass">Z′ passes</span>
            ),
        },
        { header: 'Imported by', cell: (p) => p.importedBy },
        { header: 'Imported (UTC)', cell: (p) => dateFormat.format(new Date(p.importedAt)) },
      ]}
    />
  );
}
