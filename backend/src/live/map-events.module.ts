import { Module } from '@nestjs/common';
import { MapEventsService } from './map-events.service';

/** Recording and reading map events; imported by the modules whose changes are announced (maps, pins). */
@Module({ providers: [MapEventsService], exports: [MapEventsService] })
export class MapEventsModule {}
