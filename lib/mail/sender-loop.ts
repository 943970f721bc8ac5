import 'server-only';
import { deliverDueMail } from './deliver';

const INTERVAL_MS = 15_000;

interface SenderState {
  timer?: NodeJS.Timeout;
  running?: Promise<void>;
  /** A pass was asked for while one ran: run once more when it ends, so new mail does not wait for the timer. */
  again?: boolean;
}

const globalForSender = globalThis as unknown as { gatewellMailSender?: SenderState };

/** Runs a delivery pass now, or right after the one running in this process; failures are logged, never thrown. */
export function sendDueMailNow(): Promise<void> {
  const state = (globalForSender.gatewellMailSender ??= {});
  if (state.running) {
    state.again = true;
    return state.running;
  }
  state.running = deliverDueMail()
    .then((report) => {
      if (report.retrying || report.failed)
        console.warn('mail outbox: some messages could not be sent', report);
    })
    .catch((error: unknown) => console.error('mail outbox: delivery pass failed', error))
    .finally(() => {
      state.running = undefined;
      if (state.again) {
        state.again = false;
        void sendDueMailNow();
      }
    });
  return state.running;
}

/**
 * Starts the background sender of this server process: a delivery pass every 15 seconds, so queued and
 * retried messages go out without anyone waiting on them. Starting it twice keeps one timer.
 */
export function startMailSender(intervalMs = INTERVAL_MS): void {
  const state = (globalForSender.gatewellMailSender ??= {});
  if (state.timer) return;
  state.timer = setInterval(() => void sendDueMailNow(), intervalMs);
  state.timer.unref();
  void sendDueMailNow();
}
