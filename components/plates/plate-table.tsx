import { DataTable } from '@/components/ui/data-table';
import { StateBadge } from '@/components/ui/state-badge';
import type { PlateSummary } from '@/lib/plates/list';

const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });

export function PlateTable({ plates, caption }: { plates: PlateSummary[]; caption: string }) {
  return (
    <DataTable
      caption={caption}
      rows={plates}
      rowKey={(plate) => plate.id}
      columns={[
        { header: 'Plate', cell: (p) => <span className="font-medium">{p.label}</span> },
        { header: 'Screen', cell: (p) => p.screenName },
        { header: 'Format', cell: (p) => `${p.format} wells`, align: 'right' },
        { header: 'State', cell: (p) => <StateBadge state={p.state} /> },
        { header: 'Wells failing QC', cell: (p) => `${p.failingWellCount} of ${p.wellCount}`, align: 'right' },
        { header: 'Imported by', cell: (p) => p.importedBy },
        { header: 'Imported (UTC)', cell: (p) => dateFormat.format(new Date(p.importedAt)) },
      ]}
    />
  );
}
