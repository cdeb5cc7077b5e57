import { Module } from '@nestjs/common';
import { MapsModule } from '../maps/maps.module';
import { PinsModule } from '../pins/pins.module';
import { SpeciesModule } from '../species/species.module';
import { ViewingLinksController } from './viewing-links.controller';
import { ViewingLinksService } from './viewing-links.service';

/** Read-only viewing links to one map; the public `GET /api/view/:token` is the only route without sign-in. */
@Module({ imports: [MapsModule, PinsModule, SpeciesModule], controllers: [ViewingLinksController], providers: [ViewingLinksService], exports: [ViewingLinksService] })
export class ViewingLinksModule {}
