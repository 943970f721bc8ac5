// Gatewell's fake SMTP server for development and tests: accepts every message on 127.0.0.1 and keeps it
// as one JSON file in the store folder, where tests and people read what Gatewell sent. Never deliver on.
// Started by scripts/fake-smtp.sh:  node --import tsx scripts/fake-smtp/server.ts --port 2525 --dir .var/fake-smtp/dev
import { randomUUID } from 'node:crypto';
import { mkdirSync, renameSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { SMTPServer } from 'smtp-server';
import { z } from 'zod';
import { parseMessage } from './parse-message';

const args = z
  .object({ port: z.coerce.number().int().min(1).max(65535), dir: z.string().min(1) })
  .parse(parseArgs({ options: { port: { type: 'string' }, dir: { type: 'string' } } }).values);
const store = path.resolve(args.dir, 'messages');
mkdirSync(store, { recursive: true });

function keep(raw: Buffer, envelope: { from: string; to: string[] }): string {
  const receivedAt = new Date().toISOString();
  const id = `${receivedAt.replace(/[-:.]/g, '')}-${randomUUID().slice(0, 8)}`;
  const text = raw.toString('utf8');
  const parsed = parseMessage(text);
  const file = path.join(store, `${id}.json`);
  writeFileSync(`${file}.part`, JSON.stringify({ id, receivedAt, envelope, ...parsed, raw: text }, null, 2));
  renameSync(`${file}.part`, file); // readers never see half a message
  return id;
}

const server = new SMTPServer({
  banner: 'Gatewell fake SMTP server (development and tests; keeps every message, delivers none)',
  disabledCommands: ['STARTTLS'],
  authOptional: true,
  allowInsecureAuth: true,
  size: 10 * 1024 * 1024,
  onAuth(auth, _session, callback) {
    callback(null, { user: auth.username ?? 'anonymous' });
  },
  onData(stream, session, callback) {
    const chunks: Buffer[] = [];
    stream.on('data', (chunk: Buffer) => chunks.push(chunk));
    stream.on('end', () => {
      if (stream.sizeExceeded) return callback(new Error('Message too large for the fake SMTP server'));
      const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
      const id = keep(Buffer.concat(chunks), { from, to: session.envelope.rcptTo.map((r) => r.address) });
      callback(null, `Kept as ${id}`);
    });
  },
});

server.on('error', (error) => console.error('fake SMTP server error:', error.message));
server.listen(args.port, '127.0.0.1', () =>
  console.log(`fake SMTP server on 127.0.0.1:${args.port}, keeping messages in ${store}`),
);
for (const signal of ['SIGINT', 'SIGTERM'] as const)
  process.on(signal, () => server.close(() => process.exit(0)));
