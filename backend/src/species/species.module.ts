import { Module } from '@nestjs/common';
import { TeamsModule } from '../teams/teams.module';
import { SpeciesController } from './species.controller';
import { SpeciesReads } from './species.reads';
import { SpeciesService } from './species.service';

/** The built-in species catalogue and team species lists (CSV import). */
@Module({ imports: [TeamsModule], controllers: [SpeciesController], providers: [SpeciesService, SpeciesReads], exports: [SpeciesReads] })
export class SpeciesModule {}
