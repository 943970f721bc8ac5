import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import type { SmtpSettings } from '@/lib/mail/transport';

/** A message as Gatewell's fake SMTP server (scripts/fake-smtp/server.ts) keeps it. */
export interface KeptMessage {
  id: string;
  receivedAt: string;
  envelope: { from: string; to: string[] };
  headers: Record<string, string>;
  subject: string;
  text: string;
}

/** The store folder of this test run's fake SMTP server (scripts/test.sh exports FAKE_SMTP_DIR). */
export function fakeSmtpDir(): string {
  return (
    process.env.FAKE_SMTP_DIR ??
    path.join(process.cwd(), '.var', 'fake-smtp', process.env.GATEWELL_TEST_INSTANCE ?? 'test')
  );
}

/** The fake server as an SMTP server to send to: the port of this test run (SMTP_PORT). */
export function fakeSmtpSettings(): SmtpSettings {
  return {
    host: '127.0.0.1',
    port: Number(process.env.SMTP_PORT ?? 2525),
    secure: false,
    from: 'Gatewell tests <gatewell@localhost>',
  };
}

/** Every message the fake server has kept, oldest first. */
export function keptMessages(): KeptMessage[] {
  const dir = path.join(fakeSmtpDir(), 'messages');
  let files: string[];
  try {
    files = readdirSync(dir)
      .filter((f) => f.endsWith('.json'))
      .sort();
  } catch {
    return [];
  }
  return files.map((f) => JSON.parse(readFileSync(path.join(dir, f), 'utf8')) as KeptMessage);
}

/** Waits until the fake server holds messages that match, and returns them. */
export async function waitForMessages(
  match: (m: KeptMessage) => boolean,
  count = 1,
  timeoutMs = 20_000,
): Promise<KeptMessage[]> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = keptMessages().filter(match);
    if (found.length >= count) return found;
    if (Date.now() > deadline)
      throw new Error(
        `the fake SMTP server holds ${found.length} matching message(s), expected ${count}, in ${fakeSmtpDir()}`,
      );
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}
