import 'server-only';
import pg from 'pg';
import type { Transaction } from 'sequelize';
import { env } from '@/lib/env';
import { COMPUTE_JOB_KINDS, type ComputeJobKind } from '@/lib/domain/jobs';
import { listenOn, notifyChannel } from './queries';

/**
 * Wakes workers in other processes when a job is queued. pg-boss workers look for jobs on a timer
 * (every second here); a request that waits on its job (an import, a forecast) would wait that long
 * for nothing. The enqueueing transaction NOTIFYs this channel, which PostgreSQL delivers only once
 * the transaction commits, and every worker process LISTENs on it. The timer stays as the fallback,
 * so a notice lost while the listener reconnects only costs the old delay.
 */
export const WAKE_CHANNEL = 'gatewell_jobs';

/** Notifies the listening workers of a job of this kind, delivered when the transaction commits. */
export async function notifyWorkers(kind: ComputeJobKind, transaction: Transaction): Promise<void> {
  await notifyChannel(WAKE_CHANNEL, kind, transaction);
}

interface Listener {
  stop(): Promise<void>;
}

const RECONNECT_MS = { first: 500, most: 10_000 };

/**
 * Listens on the channel over a connection of its own and calls `wake` with each notified kind;
 * reconnects after the database goes away (waiting longer each time, up to 10 s) until stopped.
 */
export function listenForJobs(wake: (kind: ComputeJobKind) => void): Listener {
  let client: pg.Client | null = null;
  let stopped = false;
  let timer: NodeJS.Timeout | null = null;
  let delay = RECONNECT_MS.first;

  const again = () => {
    if (stopped || timer) return;
    timer = setTimeout(() => {
      timer = null;
      void connect();
    }, delay);
    timer.unref();
    delay = Math.min(delay * 2, RECONNECT_MS.most);
  };

  const connect = async () => {
    const next = new pg.Client({
      connectionString: env().DATABASE_URL,
      application_name: 'gatewell-job-wake',
    });
    client = next;
    const lost = () => {
      if (client !== next) return;
      client = null;
      again();
    };
    // A restart or a broken connection: end this client and try a new one later.
    next.on('error', () => void next.end().catch(() => undefined));
    next.on('end', lost);
    next.on('notification', (message) => {
      const kind = message.payload as ComputeJobKind;
      if ((COMPUTE_JOB_KINDS as readonly string[]).includes(kind)) wake(kind);
    });
    try {
      await next.connect();
      await listenOn(next, WAKE_CHANNEL);
      delay = RECONNECT_MS.first;
      if (stopped) await next.end();
    } catch {
      await next.end().catch(() => undefined);
      lost();
    }
  };

  void connect();
  return {
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      timer = null;
      const current = client;
      client = null;
      await current?.end().catch(() => undefined);
    },
  };
}
