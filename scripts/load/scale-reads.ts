// The reads a year of data adds to the walk (scripts/scale-test.sh): a compound's profile across the
// plates it was tested on, the audit trail searched as approvers search it, and later pages of the
// plate list. The ids come from the probes file the scale fill writes (scripts/scale-fill.ts).
import { readFileSync } from 'node:fs';
import { z } from 'zod';
import type { Read } from './reader-walk';

const probesSchema = z.object({
  plateIds: z.array(z.uuid()).min(1),
  compoundIds: z.array(z.uuid()).min(1),
  approverIds: z.array(z.uuid()).min(1),
});

/** Reads of the probes file `file`, interleaved after each plate's walk of `walkLength` reads. */
export function scaleReads(file: string, plates: number): Read[][] {
  const probes = probesSchema.parse(JSON.parse(readFileSync(file, 'utf8')));
  const day = (offset: number) => new Date(Date.now() - offset * 86_400_000).toISOString().slice(0, 10);
  return Array.from({ length: plates }, (_, i) => {
    const plateId = probes.plateIds[(i * 7) % probes.plateIds.length]!;
    const approver = probes.approverIds[i % probes.approverIds.length]!;
    return [
      {
        route: 'GET /compounds/[id]/profile',
        path: `/compounds/${probes.compoundIds[i % probes.compoundIds.length]}/profile`,
      },
      { route: 'GET /audit (newest)', path: '/audit' },
      {
        route: 'GET /audit (one plate)',
        path: `/audit?entityType=plate&entityId=${plateId}`,
      },
      {
        route: 'GET /audit (person, 30 days)',
        path: `/audit?userId=${approver}&from=${day(30)}&to=${day(-1)}`,
      },
      { route: 'GET /plates?page=N', path: `/plates?page=${2 + ((i * 13) % 90)}` },
    ];
  });
}
