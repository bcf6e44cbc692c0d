import http from 'node:http';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export type CaughtMail = {
  id: number;
  messageId: string | null;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  receivedAt: string;
};

/**
 * A local stand-in for a hosted mail service: accepts every message over SMTP on loopback
 * and shows what it caught over a small HTTP API (GET /messages, GET /messages/:id,
 * DELETE /messages).
 */
export async function startFakeSmtp(opts: { smtpPort: number; httpPort?: number; mailbox?: CaughtMail[] }) {
  const mailbox = opts.mailbox ?? [];
  let nextId = mailbox.length + 1;
  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          mailbox.push({
            id: nextId++,
            messageId: mail.messageId ?? null,
            from: mail.from?.text ?? '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : null,
            receivedAt: new Date().toISOString(),
          });
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(opts.smtpPort, '127.0.0.1', () => resolve());
  });

  let web: http.Server | null = null;
  if (opts.httpPort) {
    web = http.createServer((req, res) => {
      const url = new URL(req.url ?? '/', 'http://localhost');
      const send = (status: number, body: unknown) => {
        res.writeHead(status, { 'content-type': 'application/json' });
        res.end(JSON.stringify(body));
      };
      if (url.pathname === '/messages' && req.method === 'GET') {
        const to = url.searchParams.get('to')?.toLowerCase();
        return send(200, mailbox.filter((m) => !to || m.to.some((t) => t.toLowerCase() === to)).slice().reverse());
      }
      if (url.pathname === '/messages' && req.method === 'DELETE') {
        mailbox.length = 0;
        return send(200, { cleared: true });
      }
      const m = url.pathname.match(/^\/messages\/(\d+)$/);
      if (m && req.method === 'GET') {
        const found = mailbox.find((x) => x.id === Number(m[1]));
        return found ? send(200, found) : send(404, { error: 'no such message' });
      }
      send(404, { error: 'not found' });
    });
    await new Promise<void>((resolve) => web!.listen(opts.httpPort, '127.0.0.1', () => resolve()));
  }

  return {
    mailbox,
    close: async () => {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
      if (web) await new Promise<void>((resolve) => web!.close(() => resolve()));
    },
  };
}
