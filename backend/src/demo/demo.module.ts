import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module';
import { DemoSeeder } from './demo.seeder';

/** The demo scenario's seeder (used by `db-cli seed`; it serves no routes). */
@Module({ imports: [AuthModule], providers: [DemoSeeder], exports: [DemoSeeder] })
export class DemoModule {}
