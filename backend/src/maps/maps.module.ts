import { Module } from '@nestjs/common';
import { MikroOrmModule } from '@mikro-orm/nestjs';
import { MapEventsModule } from '../live/map-events.module';
import { TeamsModule } from '../teams/teams.module';
import { MapAccessService } from './map-access.service';
import { MapReads } from './map.reads';
import { SavedMap } from './map.entity';
import { MapResultSummary } from './map-result-summary.entity';
import { MapThumbnail } from './map-thumbnail.entity';
import { MapVersion } from './map-version.entity';
import { MapsController } from './maps.controller';
import { MapsPurgeService } from './maps-purge.service';
import { MapsService } from './maps.service';

/** Saved maps, versions, summaries, thumbnails. Exports MapAccessService for pins and viewing links. */
@Module({
  imports: [TeamsModule, MapEventsModule, MikroOrmModule.forFeature([SavedMap, MapVersion, MapResultSummary, MapThumbnail])],
  controllers: [MapsController],
  providers: [MapsService, MapAccessService, MapReads, MapsPurgeService],
  exports: [MapAccessService, MapReads, MapsPurgeService, MikroOrmModule],
})
export class MapsModule {}
