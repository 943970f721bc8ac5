import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import type SMTPTransport from 'nodemailer/lib/smtp-transport';
import { z } from 'zod';
import { env } from '@/lib/env';

/** Where and how Gatewell hands its mail over: an SMTP server, plain, STARTTLS or TLS, with optional login. */
export const smtpSettingsSchema = z.object({
  host: z.string().min(1),
  port: z.number().int().min(1).max(65535),
  secure: z.boolean(),
  user: z.string().optional(),
  password: z.string().optional(),
  from: z.string().min(3),
});

export type SmtpSettings = z.infer<typeof smtpSettingsSchema>;

/** The SMTP settings of this deployment (SMTP_* and MAIL_FROM, validated by lib/env.ts). */
export function smtpSettingsFromEnv(): SmtpSettings {
  const e = env();
  return {
    host: e.SMTP_HOST,
    port: e.SMTP_PORT,
    secure: e.SMTP_SECURE === 'true',
    from: e.MAIL_FROM,
    ...(e.SMTP_USER ? { user: e.SMTP_USER, password: e.SMTP_PASSWORD ?? '' } : {}),
  };
}

/** A nodemailer SMTP transport with timeouts short enough that an unreachable server fails an attempt quickly. */
export function smtpTransport(raw: SmtpSettings): Transporter<SMTPTransport.SentMessageInfo> {
  const settings = smtpSettingsSchema.parse(raw);
  return nodemailer.createTransport({
    host: settings.host,
    port: settings.port,
    secure: settings.secure,
    ...(settings.user ? { auth: { user: settings.user, pass: settings.password ?? '' } } : {}),
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
}
