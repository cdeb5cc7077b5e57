import { Injectable, Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import nodemailer, { type Transporter } from 'nodemailer';
import type { AppConfig } from '../config/configuration';
import { MailFake } from './mail-fake';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

/**
 * Sends e-mail through nodemailer over SMTP: to FIELDBOUND_SMTP_URL when set, otherwise to the local
 * mail fake this service starts on 127.0.0.1 (development and tests), whose messages are listed at
 * GET /api/dev/mailbox and on the /dev/mailbox page.
 */
@Injectable()
export class MailService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('mail');
  private transport: Transporter | null = null;
  /** The local mail fake, or null when real SMTP is configured. */
  fake: MailFake | null = null;

  constructor(private readonly config: ConfigService<AppConfig, true>) {}

  async onModuleInit(): Promise<void> {
    const mail = this.config.get('mail', { infer: true });
    if (mail.smtpUrl) {
      this.transport = nodemailer.createTransport(mail.smtpUrl);
      this.logger.log({ event: 'mail.transport', mode: 'smtp', host: new URL(mail.smtpUrl).hostname });
      return;
    }
    this.fake = new MailFake();
    const port = await this.fake.start(mail.fakePort);
    this.transport = nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true });
    this.logger.log({ event: 'mail.transport', mode: 'local-fake', port, mailbox: '/dev/mailbox' });
  }

  async onModuleDestroy(): Promise<void> {
    this.transport?.close();
    this.transport = null;
    await this.fake?.stop();
  }

  get usesFake(): boolean {
    return this.fake !== null;
  }

  /** Delivers one message to the SMTP server; rejects when the server refuses it or cannot be reached. */
  async send(mail: OutgoingMail): Promise<void> {
    if (!this.transport) throw new Error('the mail transport is not started');
    const from = this.config.get('mail', { infer: true }).from;
    const info = (await this.transport.sendMail({ from, to: mail.to, subject: mail.subject, text: mail.text, html: mail.html })) as { messageId?: string };
    // The address is personal data and the body holds one-time links: log neither.
    this.logger.log({ event: 'mail.sent', subject: mail.subject, messageId: info.messageId });
  }

  /** Sends without making the caller wait or fail; a failure is logged. For answers that must not reveal anything. */
  sendInBackground(mail: OutgoingMail): Promise<boolean> {
    return this.send(mail).then(
      () => true,
      (error: unknown) => {
        this.logger.error({ event: 'mail.failed', subject: mail.subject, error: (error as Error).message });
        return false;
      },
    );
  }
}
