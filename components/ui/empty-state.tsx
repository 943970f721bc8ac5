import type { ReactNode } from 'react';

export function EmptyState({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="gw-card border-dashed p-8 text-center">
      <p className="font-medium text-ink-900">{title}</p>
      <div className="mt-1 text-sm text-ink-700">{children}</div>
    </div>
  );
}
