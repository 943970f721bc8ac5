import 'server-only';
import { z } from 'zod';
import { isTimeZone } from '@/lib/domain/time-zone';

const schema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  DATABASE_URL: z.url({ protocol: /^postgres(ql)?$/, error: 'DATABASE_URL must be a postgres:// URL' }),
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters'),
  APP_URL: z.url().default('http://127.0.0.1:4310'),
  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().positive().default(2525),
  SMTP_SECURE: z.enum(['true', 'false']).default('false'),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().default('Gatewell <gatewell@localhost>'),
  // The longest any job may stay taken before it counts as lost (its worker died) and is retried; each
  // kind's own limit (lib/jobs/kinds.ts) applies when it is shorter. Unset: the kinds' own limits.
  GATEWELL_JOB_EXPIRE_SECONDS: z.coerce.number().int().min(1).max(3600).optional(),
  // How often the queue looks for lost jobs (and archives old ones); one process does it per interval.
  GATEWELL_JOB_MAINTENANCE_SECONDS: z.coerce.number().int().min(1).max(3600).default(30),
  /** The IANA time zone the audit trail shows and reads times in (UTC unless set). */
  GATEWELL_TIME_ZONE: z
    .string()
    .default('UTC')
    .refine(isTimeZone, 'GATEWELL_TIME_ZONE must be an IANA time zone such as Europe/Berlin'),
});

export type Env = z.infer<typeof schema>;

let cached: Env | undefined;

/** The validated environment; read on first use so that `next build` needs no secrets. */
export function env(): Env {
  if (cached) return cached;
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Gatewell's environment is not valid:\n  ${problems.join('\n  ')}`);
  }
  cached = parsed.data;
  return cached;
}
