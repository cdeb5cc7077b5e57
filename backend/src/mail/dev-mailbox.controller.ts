import { Controller, Delete, Get, HttpCode, NotFoundException } from '@nestjs/common';
import { Public } from '../common/public.decorator';
import type { CapturedMessage } from './mail-fake';
import { MailService } from './mail.service';

/**
 * The local mail fake's inbox, for people developing or testing Fieldbound. It exists only while
 * the fake is in use: with real SMTP configured every route here answers 404.
 */
@Public()
@Controller('dev/mailbox')
export class DevMailboxController {
  constructor(private readonly mail: MailService) {}

  @Get()
  list(): { messages: CapturedMessage[] } {
    return { messages: this.fake().list() };
  }

  @Delete()
  @HttpCode(204)
  clear(): void {
    this.fake().clear();
  }

  private fake() {
    if (!this.mail.fake) throw new NotFoundException({ statusCode: 404, code: 'mailbox_unavailable', message: 'The local mailbox exists only when no SMTP server is configured.' });
    return this.mail.fake;
  }
}
