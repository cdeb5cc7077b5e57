import crypto from 'node:crypto';
import { SMTPServer } from 'smtp-server';
import { extractLinks, parseMessage } from './mime';

import type { CapturedMessage } from '@fieldbound/shared';

export type { CapturedMessage };

/**
 * A real SMTP server on 127.0.0.1, started in-process when no FIELDBOUND_SMTP_URL is set, that keeps
 * every message it receives in memory (newest first, at most `capacity`). The application's mailer
 * talks SMTP to it exactly as it would to a real relay.
 */
export class MailFake {
  private readonly messages: CapturedMessage[] = [];
  private server: SMTPServer | null = null;
  private listeners = new Set<(message: CapturedMessage) => void>();
  port = 0;

  constructor(private readonly capacity = 500) {}

  async start(port: number): Promise<number> {
    const server = new SMTPServer({
      secure: false,
      authOptional: true,
      disabledCommands: ['AUTH', 'STARTTLS'],
      hideSTARTTLS: true,
      logger: false,
      size: 5 * 1024 * 1024,
      onData: (stream, session, callback) => {
        const chunks: Buffer[] = [];
        stream.on('data', (chunk: Buffer) => chunks.push(chunk));
        stream.on('error', callback);
        stream.on('end', () => {
          try {
            this.capture(Buffer.concat(chunks).toString('utf8'), session.envelope);
            callback();
          } catch (error) {
            callback(error as Error);
          }
        });
      },
    });
    this.server = server;
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, '127.0.0.1', () => {
        server.off('error', reject);
        resolve();
      });
    });
    this.port = (server.server.address() as { port: number }).port;
    return this.port;
  }

  async stop(): Promise<void> {
    const server = this.server;
    this.server = null;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  list(): CapturedMessage[] {
    return [...this.messages];
  }

  clear(): void {
    this.messages.length = 0;
  }

  /** Calls `listener` for each message received from now on; returns the unsubscribe function. */
  onMessage(listener: (message: CapturedMessage) => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  private capture(raw: string, envelope: { mailFrom: false | { address: string }; rcptTo: { address: string }[] }): void {
    const parsed = parseMessage(raw);
    const text = parsed.text ?? '';
    const message: CapturedMessage = {
      id: crypto.randomUUID(),
      from: envelope.mailFrom ? envelope.mailFrom.address : '',
      to: envelope.rcptTo.map((r) => r.address.toLowerCase()),
      subject: parsed.subject,
      text,
      html: parsed.html,
      links: extractLinks(text),
      receivedAt: new Date().toISOString(),
    };
    this.messages.unshift(message);
    if (this.messages.length > this.capacity) this.messages.length = this.capacity;
    for (const listener of this.listeners) listener(message);
  }
}
