import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import type SMTPPool from "nodemailer/lib/smtp-pool";
import { env } from "@/lib/env";

// nodemailer over SMTP (DESIGN §7). Development, demo and tests point at the fake SMTP server.

export interface SmtpSettings {
  host: string;
  port: number;
  secure: boolean;
  user?: string;
  password?: string;
}

export function smtpSettingsFromEnv(): SmtpSettings {
  return { host: env.SMTP_HOST, port: env.SMTP_PORT, secure: env.SMTP_SECURE, user: env.SMTP_USER, password: env.SMTP_PASSWORD };
}

export function createMailTransport(settings: SmtpSettings = smtpSettingsFromEnv()): Transporter {
  const options: SMTPPool.Options = {
    host: settings.host,
    port: settings.port,
    secure: settings.secure,
    // Without TLS (the local fake has none that works) do not try STARTTLS at all.
    ignoreTLS: !settings.secure,
    auth: settings.user ? { user: settings.user, pass: settings.password ?? "" } : undefined,
    // The fake waits 100 ms before each greeting (STACK.md): keep a connection open and reuse it.
    pool: true,
    maxConnections: 2,
    // A hanging server must not hold a message's lease for long; the sender retries later.
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  };
  return nodemailer.createTransport(options);
}
