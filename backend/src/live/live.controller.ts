import { applyDecorators, Controller, Get, Headers, Param, Query, Req, Res, UseGuards } from '@nestjs/common';
import { ApiBearerAuth, ApiHeader, ApiOkResponse, ApiOperation, ApiProduces, ApiQuery, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { LIVE_HEARTBEAT_MS } from '@fieldbound/shared';
import { type AuthUser, CurrentUser } from '../common/current-user.decorator';
import { Public } from '../common/public.decorator';
import { ViewingLinkThrottlerGuard } from '../viewing-links/viewing-link-throttler.guard';
import { LiveService, parseLastEventId } from './live.service';

const STREAM_FORMAT =
  `Server-sent events: \`id: <event id>\`, \`event: map\`, \`data: <JSON>\`; a comment line every ${LIVE_HEARTBEAT_MS / 1000} s. ` +
  'A reconnecting client sends the last id back (Last-Event-ID) and first receives every later event of the map, in id order. ' +
  'Events are kept 7 days (FIELDBOUND_EVENT_RETENTION_DAYS). Types: MapLiveEvent / SharedLiveEvent in shared/src/api/live.ts.';

const EXAMPLE = 'id: 42\nevent: map\ndata: {"id":"42","mapId":"…","at":"…","kind":"pin.deleted","pinId":"…"}\n\n: heartbeat\n\n';

const LastEventIdDocs = () =>
  applyDecorators(
    ApiHeader({ name: 'Last-Event-ID', required: false, description: 'Id of the last event received; later events are sent first.' }),
    ApiQuery({ name: 'lastEventId', required: false, type: String, description: 'Same as the Last-Event-ID header (the header wins).' }),
  );

/** Live updates of maps as server-sent events (written to the raw response: headers, disconnects and backpressure are handled in LiveHubService). */
@ApiTags('live updates')
@Controller()
export class LiveController {
  constructor(private readonly live: LiveService) {}

  @Get('maps/:mapId/events')
  @ApiBearerAuth()
  @ApiProduces('text/event-stream')
  @ApiOperation({ summary: "A map's live updates: pins created, changed, deleted and replied to, and map saves (viewers and up)", description: STREAM_FORMAT })
  @ApiOkResponse({ description: 'An open event stream of MapLiveEvent.', content: { 'text/event-stream': { schema: { type: 'string', example: EXAMPLE } } } })
  @LastEventIdDocs()
  async mapEvents(
    @Param('mapId') mapId: string,
    @CurrentUser() user: AuthUser,
    @Headers('last-event-id') lastEventIdHeader: string | undefined,
    @Query('lastEventId') lastEventIdQuery: string | undefined,
    @Req() req: Request,
    @Res() res: Response,
  ): Promise<void> {
    await this.live.memberStream(mapId, user, parseLastEventId(lastEventIdHeader, lastEventIdQuery), req, res);
  }

  // Public: a viewing link is for people without an account. Rate-limited with GET /api/view/:token, so guessing tokens here is no easier.
  @Get('view/:token/events')
  @Public()
  @UseGuards(ViewingLinkThrottlerGuard)
  @ApiProduces('text/event-stream')
  @ApiOperation({
    summary: "Live updates behind a viewing link: map saves, and pins without authors or threads when the link shows pins. No sign-in; 404 unknown or revoked, 410 expired.",
    description: STREAM_FORMAT,
  })
  @ApiOkResponse({ description: 'An open event stream of SharedLiveEvent.', content: { 'text/event-stream': { schema: { type: 'string', example: EXAMPLE } } } })
  @LastEventIdDocs()
  async linkEvents(
    @Param('token') token: string,
    @Headers('last-event-id') lastEventIdHeader: string | undefined,
    @Query('lastEventId') lastEventIdQuery: string | undefined,
    @Req() req: Request,
    @Res() res: Response,
  ): Promise<void> {
    res.setHeader('Referrer-Policy', 'no-referrer');
    await this.live.linkStream(token, parseLastEventId(lastEventIdHeader, lastEventIdQuery), req, res);
  }
}
