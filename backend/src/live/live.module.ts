import { Module } from '@nestjs/common';
import { MapsModule } from '../maps/maps.module';
import { ViewingLinksModule } from '../viewing-links/viewing-links.module';
import { LiveController } from './live.controller';
import { LiveHubService } from './live-hub.service';
import { LiveListenerService } from './live-listener.service';
import { LiveMaintenanceService } from './live-maintenance.service';
import { LiveService } from './live.service';
import { MapEventsModule } from './map-events.module';

/**
 * Live map updates over server-sent events, across server instances: events are rows of `map_events`
 * (written by maps and pins through MapEventsModule) announced with PostgreSQL NOTIFY; each instance
 * LISTENs on one dedicated connection and streams the rows to its own subscribers.
 */
@Module({
  imports: [MapsModule, ViewingLinksModule, MapEventsModule],
  controllers: [LiveController],
  providers: [LiveService, LiveHubService, LiveListenerService, LiveMaintenanceService],
  exports: [LiveHubService, LiveListenerService],
})
export class LiveModule {}
