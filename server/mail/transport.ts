import nodemailer, { type Transporter } from 'nodemailer';

/** Production: the configured SMTP server. Elsewhere: the local fake server on `fakePort`. */
export function createTransport(smtpUrl: string | null, fakePort: number): Transporter {
  if (smtpUrl) return nodemailer.createTransport(smtpUrl);
  return nodemailer.createTransport({
    host: '127.0.0.1',
    port: fakePort,
    secure: false,
    ignoreTLS: true,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    socketTimeout: 10000,
  });
}
