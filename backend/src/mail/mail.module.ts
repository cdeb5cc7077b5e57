import { Global, Module } from '@nestjs/common';
import { DevMailboxController } from './dev-mailbox.controller';
import { MailService } from './mail.service';

@Global()
@Module({ controllers: [DevMailboxController], providers: [MailService], exports: [MailService] })
export class MailModule {}
