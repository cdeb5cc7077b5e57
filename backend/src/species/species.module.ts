import { Module } from '@nestjs/common';
import { TeamsModule } from '../teams/teams.module';
import { SpeciesController } from './species.controller';
import { SpeciesService } from './species.service';

/** The built-in species catalogue and team species lists (CSV import). */
@Module({ imports: [TeamsModule], controllers: [SpeciesController], providers: [SpeciesService] })
export class SpeciesModule {}
