import { Module } from '@nestjs/common';
import { MapsModule } from '../maps/maps.module';
import { PinsController } from './pins.controller';
import { PinsService } from './pins.service';

/** Pins on maps and their reply threads; mentions are e-mailed through the global MailService. */
@Module({ imports: [MapsModule], controllers: [PinsController], providers: [PinsService] })
export class PinsModule {}
