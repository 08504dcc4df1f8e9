import nodemailer, { type Transporter } from 'nodemailer';

/**
 * How long one send may wait on the mail server, ms. A server that accepts the connection and
 * then says nothing fails the attempt after these, and the outbox tries again later; nodemailer's
 * own defaults (2 min, 30 s, 10 min) would keep one message waiting for many minutes.
 */
export interface MailTimeouts {
  /** Connecting, DNS included. */
  connectionTimeout: number;
  /** The server's greeting after connecting. */
  greetingTimeout: number;
  /** Silence on an open connection. */
  socketTimeout: number;
}

export const MAIL_TIMEOUTS: MailTimeouts = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 };

/** Production: the configured SMTP server. Elsewhere: the local fake server on `fakePort`. */
export function createTransport(smtpUrl: string | null, fakePort: number, timeouts: MailTimeouts = MAIL_TIMEOUTS): Transporter {
  if (smtpUrl) return nodemailer.createTransport({ url: smtpUrl, ...timeouts });
  return nodemailer.createTransport({
    host: '127.0.0.1',
    port: fakePort,
    secure: false,
    ignoreTLS: true,
    ...timeouts,
  });
}
