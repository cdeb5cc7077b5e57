import { Body, Controller, Delete, Get, Header, HttpCode, Param, Post, UseGuards } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { CreatedViewingLink, SharedMapView, ViewingLinkView } from '@fieldbound/shared';
import { type AuthUser, CurrentUser } from '../common/current-user.decorator';
import { Public } from '../common/public.decorator';
import { CreateViewingLinkDto } from './dto/viewing-link.dto';
import { ViewingLinkThrottlerGuard } from './viewing-link-throttler.guard';
import { ViewingLinksService } from './viewing-links.service';

@ApiTags('viewing links')
@Controller()
export class ViewingLinksController {
  constructor(private readonly links: ViewingLinksService) {}

  @Get('maps/:mapId/viewing-links')
  @ApiBearerAuth()
  @ApiOperation({ summary: "A map's viewing links, without their tokens (editors)" })
  list(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser): Promise<ViewingLinkView[]> {
    return this.links.list(mapId, user);
  }

  @Post('maps/:mapId/viewing-links')
  @ApiBearerAuth()
  @ApiOperation({ summary: 'Create a read-only link; the token is in this answer only (editors)' })
  @Header('Cache-Control', 'no-store')
  create(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser, @Body() dto: CreateViewingLinkDto): Promise<CreatedViewingLink> {
    return this.links.create(mapId, user, dto);
  }

  @Delete('maps/:mapId/viewing-links/:linkId')
  @ApiBearerAuth()
  @HttpCode(204)
  @ApiOperation({ summary: 'Revoke a viewing link (editors)' })
  revoke(@Param('mapId') mapId: string, @Param('linkId') linkId: string, @CurrentUser() user: AuthUser): Promise<void> {
    return this.links.revoke(mapId, linkId, user);
  }

  @Get('view/:token')
  @Public()
  @UseGuards(ViewingLinkThrottlerGuard)
  @Header('Cache-Control', 'no-store')
  @Header('Referrer-Policy', 'no-referrer')
  @ApiOperation({
    summary: 'The map behind a viewing link: title, description, setup, the species its overlay names and (if allowed) pins. No sign-in; 404 unknown or revoked, 410 expired.',
    description:
      '`species` holds the entries `setup.species` names — a catalogue atom by name or symbol, a species of the map\'s team lists by name — with their values and sources, without row or list ids; names that match nothing are absent.',
  })
  view(@Param('token') token: string): Promise<SharedMapView> {
    return this.links.view(token);
  }
}
