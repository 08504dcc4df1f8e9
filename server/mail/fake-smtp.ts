import fs from 'node:fs';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface CaughtMail {
  to: string[];
  from: string;
  subject: string;
  text: string;
  html: string;
  /** Files sent with the message, decoded. */
  attachments: Array<{ filename: string; contentType: string; content: Buffer }>;
  receivedAt: Date;
}

/**
 * A local SMTP server that catches every message, for development and tests, so no mail
 * leaves the machine. Messages are kept in memory and, when `saveDir` is set, written there.
 */
export class FakeMailServer {
  readonly messages: CaughtMail[] = [];
  private server: SMTPServer | null = null;
  private listeners: Array<() => void> = [];
  port = 0;

  constructor(private readonly saveDir: string | null = null) {}

  async start(port = 0): Promise<number> {
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS'],
      logger: false,
      onData: (stream, _session, callback) => {
        const chunks: Buffer[] = [];
        stream.on('data', (c: Buffer) => chunks.push(c));
        stream.on('end', () => {
          const raw = Buffer.concat(chunks);
          simpleParser(raw)
            .then((mail) => {
              const to = [mail.to].flat().flatMap((a) => (a ? a.value.map((v) => v.address ?? '') : []));
              const caught: CaughtMail = {
                to,
                from: mail.from?.text ?? '',
                subject: mail.subject ?? '',
                text: mail.text ?? '',
                html: typeof mail.html === 'string' ? mail.html : '',
                attachments: mail.attachments.map((a) => ({ filename: a.filename ?? '', contentType: a.contentType, content: a.content })),
                receivedAt: new Date(),
              };
              this.messages.push(caught);
              if (this.saveDir) this.save(raw, caught);
              for (const l of this.listeners.splice(0)) l();
              callback();
            })
            .catch((err: Error) => callback(err));
        });
      },
    });
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, '127.0.0.1', () => resolve());
    });
    server.on('error', () => undefined);
    this.server = server;
    this.port = (server.server.address() as { port: number }).port;
    return this.port;
  }

  async stop(): Promise<void> {
    const server = this.server;
    this.server = null;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  /** Messages to one address, oldest first. */
  to(address: string): CaughtMail[] {
    return this.messages.filter((m) => m.to.includes(address.toLowerCase()));
  }

  /** Waits until `predicate` holds for some caught message. */
  async waitFor(predicate: (m: CaughtMail) => boolean, timeoutMs = 10_000): Promise<CaughtMail> {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const found = this.messages.find(predicate);
      if (found) return found;
      const left = deadline - Date.now();
      if (left <= 0) throw new Error('no matching e-mail arrived at the fake mail server');
      await new Promise<void>((resolve) => {
        const t = setTimeout(resolve, Math.min(left, 200));
        this.listeners.push(() => {
          clearTimeout(t);
          resolve();
        });
      });
    }
  }

  private save(raw: Buffer, mail: CaughtMail): void {
    if (!this.saveDir) return;
    fs.mkdirSync(this.saveDir, { recursive: true });
    const stamp = mail.receivedAt.toISOString().replace(/[:.]/g, '-');
    const safe = (mail.to[0] ?? 'unknown').replace(/[^a-z0-9@._-]/gi, '_');
    fs.writeFileSync(path.join(this.saveDir, `${stamp}-${safe}.eml`), raw);
  }
}
