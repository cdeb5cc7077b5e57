import { Module } from '@nestjs/common';
import { MapEventsModule } from '../live/map-events.module';
import { MapsModule } from '../maps/maps.module';
import { PinsController } from './pins.controller';
import { PinReads } from './pin.reads';
import { PinsService } from './pins.service';

/** Pins on maps and their reply threads; mentions are e-mailed through the global MailService. */
@Module({ imports: [MapsModule, MapEventsModule], controllers: [PinsController], providers: [PinsService, PinReads], exports: [PinReads] })
export class PinsModule {}
