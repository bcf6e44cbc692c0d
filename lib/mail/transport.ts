import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { env } from '@/lib/env';

let transport: Transporter | undefined;

export function mailTransport(): Transporter {
  const e = env();
  transport ??= nodemailer.createTransport({
    host: e.SMTP_HOST,
    port: e.SMTP_PORT,
    secure: e.SMTP_SECURE,
    auth: e.SMTP_USER ? { user: e.SMTP_USER, pass: e.SMTP_PASS } : undefined,
    pool: true,
    // Sending is bound by SMTP round trips, not CPU: 16 connections reach well over 200 mails/s
    // on a loaded two-core machine (tests/bench/outbox-send.ts); 8 reached about 120.
    maxConnections: 16,
    maxMessages: Infinity,
    // The local catcher has no TLS; a real server gets STARTTLS when it offers it, and
    // credentials never go out without it.
    ignoreTLS: e.LOADPROOF_LOCAL && !e.SMTP_USER,
    requireTLS: !!e.SMTP_USER && !e.SMTP_SECURE,
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
    // Well inside the outbox lease (120 s): a send that hangs fails and is retried, and can never
    // still be running when its row is leased again.
    socketTimeout: 30_000,
  });
  return transport;
}

export function resetMailTransport(): void {
  transport?.close();
  transport = undefined;
}
