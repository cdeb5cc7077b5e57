import { Body, Controller, Delete, Get, HttpCode, Param, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { PinDetail, PinReplyView, PinView } from '@fieldbound/shared';
import { type AuthUser, CurrentUser } from '../common/current-user.decorator';
import { CreatePinDto, CreateReplyDto, ListPinsQueryDto, UpdatePinDto } from './dto/pin.dto';
import { PinsService } from './pins.service';

@ApiTags('pins')
@ApiBearerAuth()
@Controller()
export class PinsController {
  constructor(private readonly pins: PinsService) {}

  @Get('maps/:mapId/pins')
  @ApiOperation({ summary: "A map's pins (optionally only open or resolved ones)" })
  list(@Param('mapId') mapId: string, @Query() query: ListPinsQueryDto, @CurrentUser() user: AuthUser): Promise<PinView[]> {
    return this.pins.list(mapId, user, query.status);
  }

  @Post('maps/:mapId/pins')
  @ApiOperation({ summary: 'Pin a note to a point, rectangle or polygon of the map (editors)' })
  create(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser, @Body() dto: CreatePinDto): Promise<PinView> {
    return this.pins.create(mapId, user, dto);
  }

  @Get('pins/:pinId')
  @ApiOperation({ summary: 'One pin with its thread' })
  get(@Param('pinId') pinId: string, @CurrentUser() user: AuthUser): Promise<PinDetail> {
    return this.pins.get(pinId, user);
  }

  @Patch('pins/:pinId')
  @ApiOperation({ summary: 'Edit, move, resolve or reopen a pin (409 with the current pin when expectedVersion is stale)' })
  update(@Param('pinId') pinId: string, @CurrentUser() user: AuthUser, @Body() dto: UpdatePinDto): Promise<PinView> {
    return this.pins.update(pinId, user, dto);
  }

  @Delete('pins/:pinId')
  @HttpCode(204)
  @ApiOperation({ summary: 'Delete a pin and its thread (editors)' })
  remove(@Param('pinId') pinId: string, @CurrentUser() user: AuthUser): Promise<void> {
    return this.pins.remove(pinId, user);
  }

  @Post('pins/:pinId/replies')
  @ApiOperation({ summary: "Reply in a pin's thread (viewers too)" })
  reply(@Param('pinId') pinId: string, @CurrentUser() user: AuthUser, @Body() dto: CreateReplyDto): Promise<PinReplyView> {
    return this.pins.reply(pinId, user, dto);
  }

  @Delete('pins/:pinId/replies/:replyId')
  @HttpCode(204)
  @ApiOperation({ summary: 'Delete a reply (its author, or an editor)' })
  removeReply(@Param('pinId') pinId: string, @Param('replyId') replyId: string, @CurrentUser() user: AuthUser): Promise<void> {
    return this.pins.removeReply(pinId, replyId, user);
  }
}
