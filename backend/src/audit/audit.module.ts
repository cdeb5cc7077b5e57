import { Global, Module } from '@nestjs/common';
import { TeamsModule } from '../teams/teams.module';
import { AuditController } from './audit.controller';
import { AuditService } from './audit.service';

/** The audit log: global so every feature can record events in its own flush. */
@Global()
@Module({ imports: [TeamsModule], controllers: [AuditController], providers: [AuditService], exports: [AuditService] })
export class AuditModule {}
