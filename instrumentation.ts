// Next calls register() once when a server process starts: Gatewell starts its mail sender there.
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== 'nodejs' || process.env.GATEWELL_MAIL_SENDER === 'off') return;
  const { startMailSender } = await import('./lib/mail/sender-loop');
  startMailSender();
}
