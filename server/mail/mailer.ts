import nodemailer from 'nodemailer';
import { SMTPServer } from 'smtp-server';

export interface Mail {
  to: string;
  subject: string;
  text: string;
}
export interface Mailer {
  send(m: Mail): Promise<void>;
}

export function smtpMailer(opts: { host: string; port: number; from: string }): Mailer {
  const transport = nodemailer.createTransport({ host: opts.host, port: opts.port, secure: false, ignoreTLS: true, connectionTimeout: 5000, greetingTimeout: 5000, socketTimeout: 10000 });
  return {
    async send(m) {
      await transport.sendMail({ from: opts.from, to: m.to, subject: m.subject, text: m.text });
    },
  };
}

export interface ReceivedMail {
  to: string[];
  from: string;
  raw: string;
  subject: string;
  at: string;
}

/** A local SMTP server for dev and test: accepts everything and keeps it in memory for the Outbox screen. */
export async function startFakeSmtp(port: number, host = '127.0.0.1'): Promise<{ port: number; received: ReceivedMail[]; close(): Promise<void> }> {
  const received: ReceivedMail[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, session, cb) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks).toString('utf8');
        const subject = decodeHeader(/^Subject: (.*)$/im.exec(unfoldHeaders(raw))?.[1]?.trim() ?? '');
        received.push({
          to: session.envelope.rcptTo.map((r) => r.address),
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          raw,
          subject,
          at: new Date().toISOString(),
        });
        if (received.length > 500) received.shift();
        cb();
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const addr = server.server.address();
  return {
    port: typeof addr === 'object' && addr ? addr.port : port,
    received,
    close: () => new Promise<void>((r) => server.close(() => r())),
  };
}

/** Joins folded header lines (RFC 5322 §2.2.3) of the header block. */
export function unfoldHeaders(raw: string): string {
  const end = raw.search(/\r?\n\r?\n/);
  const head = end === -1 ? raw : raw.slice(0, end);
  return head.replace(/\r?\n[ \t]+/g, ' ');
}

/** Decodes RFC 2047 encoded words (=?utf-8?Q?...?= and =?utf-8?B?...?=) as nodemailer writes them. */
export function decodeHeader(v: string): string {
  return v
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_m, _cs: string, enc: string, text: string) => {
      if (enc.toUpperCase() === 'B') return Buffer.from(text, 'base64').toString('utf8');
      const bytes = text.replace(/_/g, ' ').replace(/=([0-9A-Fa-f]{2})/g, (_x, h: string) => String.fromCharCode(parseInt(h, 16)));
      return Buffer.from(bytes, 'latin1').toString('utf8');
    });
}
