// Next calls register() once when a server process starts: Gatewell starts its mail sender there,
// and job workers (fits and forecasts) unless GATEWELL_JOB_WORKER=off leaves them to scripts/worker.ts.
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  if (process.env.GATEWELL_MAIL_SENDER !== 'off') {
    const { startMailSender } = await import('./lib/mail/sender-loop');
    startMailSender();
  }
  if (process.env.GATEWELL_JOB_WORKER !== 'off') {
    const { startJobWorkers } = await import('./lib/jobs/worker');
    startJobWorkers().catch((error: unknown) =>
      console.error(
        `[gatewell jobs] workers did not start: ${error instanceof Error ? error.message : String(error)}`,
      ),
    );
  }
}
