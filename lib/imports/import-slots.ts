import 'server-only';
import { AppError } from '@/lib/errors';

/**
 * Reading an uploaded file (inspect, preview, commit) is the heaviest request Gatewell serves. Each web
 * process reads at most GATEWELL_IMPORT_SLOTS files at once (default 1); later uploads wait their turn
 * in arrival order, so that however many people import at once, imports take a bounded share of the
 * CPU and page requests keep answering quickly. An upload that would wait behind too many others, or
 * too long, is refused with a 503 before anything is read or written.
 */
export const IMPORT_QUEUE_LIMIT = 50;
export const IMPORT_WAIT_LIMIT_MS = 60_000;

interface Waiter {
  start: () => void;
  timer: NodeJS.Timeout;
}

interface Slots {
  running: number;
  waiting: Waiter[];
}

const slotsKey = Symbol.for('gatewell.importSlots');
function slots(): Slots {
  const store = globalThis as { [slotsKey]?: Slots };
  return (store[slotsKey] ??= { running: 0, waiting: [] });
}

function capacity(): number {
  const configured = Number(process.env.GATEWELL_IMPORT_SLOTS ?? 1);
  return Number.isInteger(configured) && configured > 0 ? configured : 1;
}

const BUSY = 'Gatewell is reading other uploads just now; nothing was changed. Try again in a minute.';

/** Runs `work` once an import slot of this process is free. */
export async function withImportSlot<T>(work: () => Promise<T>): Promise<T> {
  const state = slots();
  if (state.running >= capacity()) {
    if (state.waiting.length >= IMPORT_QUEUE_LIMIT) throw new AppError('unavailable', BUSY);
    await new Promise<void>((resolve, reject) => {
      const waiter: Waiter = {
        start: () => {
          clearTimeout(waiter.timer);
          resolve();
        },
        timer: setTimeout(() => {
          state.waiting.splice(state.waiting.indexOf(waiter), 1);
          reject(new AppError('unavailable', BUSY));
        }, IMPORT_WAIT_LIMIT_MS),
      };
      state.waiting.push(waiter);
    });
  } else {
    state.running += 1;
  }
  try {
    return await work();
  } finally {
    // The slot passes straight to the next upload in line, or is given back.
    const next = state.waiting.shift();
    if (next) next.start();
    else state.running -= 1;
  }
}
