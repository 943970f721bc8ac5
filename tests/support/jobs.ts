import { setTimeout as sleep } from 'node:timers/promises';
import { db } from '@/lib/db';
import { Plate } from '@/models';

/** Waits until the plate's queued refit has run (the file's job workers take it); fails after the bound. */
export async function fitsCurrent(plateId: string, timeoutMs = 30_000): Promise<void> {
  db();
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const plate = await Plate.findByPk(plateId, { attributes: ['fitsPending'], rejectOnEmpty: true });
    if (!plate.fitsPending) return;
    if (Date.now() > deadline)
      throw new Error(`the fits of plate ${plateId} were still pending after ${timeoutMs} ms`);
    await sleep(50);
  }
}
