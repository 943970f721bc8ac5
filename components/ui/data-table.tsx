import type { ReactNode } from 'react';

export interface Column<Row> {
  header: string;
  cell: (row: Row) => ReactNode;
  align?: 'left' | 'right';
}

/** A plain, accessible table for short server-rendered lists. */
export function DataTable<Row>({
  caption,
  columns,
  rows,
  rowKey,
}: {
  caption: string;
  columns: Column<Row>[];
  rows: Row[];
  rowKey: (row: Row) => string;
}) {
  return (
    <div className="gw-card overflow-x-auto">
      <table className="min-w-full text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-ink-100/60 text-left text-xs uppercase tracking-wide text-ink-700">
          <tr>
            {columns.map((column) => (
              <th
                key={column.header}
                scope="col"
                className={`px-4 py-2.5 font-semibold ${column.align === 'right' ? 'text-right' : ''}`}
              >
                {column.header}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-100">
          {rows.map((row) => (
            <tr key={rowKey(row)} className="hover:bg-paper">
              {columns.map((column) => (
                <td
                  key={column.header}
                  className={`px-4 py-2.5 ${column.align === 'right' ? 'text-right tabular-nums' : ''}`}
                >
                  {column.cell(row)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
