import { Body, Controller, Delete, Get, HttpCode, Param, ParseIntPipe, Patch, Post, Put, Query, Res, UploadedFile, UseInterceptors } from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import {
  type DeletedMapItem, MAP_LIMITS, type MapDetail, type MapDiffResponse, type MapListResponse, type MapVersionDetail,
  type MapVersionSummary, type ResultSummary,
} from '@fieldbound/shared';
import type { UploadedBytes } from '../common/uploaded-file';
import { type AuthUser, CurrentUser } from '../common/current-user.decorator';
import type { Membership } from '../teams/membership.entity';
import { CurrentMembership, TeamRole } from '../teams/team-role.guard';
import { CreateMapDto, DiffQueryDto, DuplicateMapDto, ListMapsQueryDto, PutResultSummaryDto, RestoreVersionDto, UpdateMapDto } from './dto/map.dto';
import { MapsService } from './maps.service';

/** Maps of a team (`/teams/:teamId/maps`) and one map (`/maps/:mapId`). */
@ApiTags('maps')
@ApiBearerAuth()
@Controller()
export class MapsController {
  constructor(private readonly maps: MapsService) {}

  @Get('teams/:teamId/maps')
  @TeamRole('viewer', { roleOnly: true })
  @ApiOperation({ summary: "List the team's maps (search in titles and tags, sort, page)" })
  list(@Param('teamId') teamId: string, @Query() query: ListMapsQueryDto): Promise<MapListResponse> {
    return this.maps.list(teamId, query);
  }

  @Post('teams/:teamId/maps')
  @TeamRole('editor')
  @ApiOperation({ summary: 'Create a map (version 1); the setup is validated field by field' })
  create(@CurrentMembership() membership: Membership, @CurrentUser() user: AuthUser, @Body() dto: CreateMapDto): Promise<MapDetail> {
    return this.maps.create(membership.team, user, dto);
  }

  @Get('teams/:teamId/maps/deleted')
  @TeamRole('owner')
  @ApiOperation({ summary: 'Maps in the bin that an owner can still restore' })
  listDeleted(@Param('teamId') teamId: string): Promise<DeletedMapItem[]> {
    return this.maps.listDeleted(teamId);
  }

  @Get('maps/:mapId')
  @ApiOperation({ summary: 'One map with its setup' })
  get(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser): Promise<MapDetail> {
    return this.maps.get(mapId, user);
  }

  @Patch('maps/:mapId')
  @ApiOperation({ summary: 'Save an edit as a new version (409 with the current map when expectedVersion is stale)' })
  update(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser, @Body() dto: UpdateMapDto): Promise<MapDetail> {
    return this.maps.update(mapId, user, dto);
  }

  @Delete('maps/:mapId')
  @HttpCode(204)
  @ApiOperation({ summary: `Move a map to the bin (owners can restore it for ${MAP_LIMITS.restoreWindowDays} days)` })
  remove(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser): Promise<void> {
    return this.maps.remove(mapId, user);
  }

  @Post('maps/:mapId/restore')
  @HttpCode(200)
  @ApiOperation({ summary: 'Take a map out of the bin (owners)' })
  restore(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser): Promise<MapDetail> {
    return this.maps.restoreDeleted(mapId, user);
  }

  @Post('maps/:mapId/duplicate')
  @ApiOperation({ summary: 'Copy a map into its team or another team where you are an editor or owner' })
  duplicate(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser, @Body() dto: DuplicateMapDto): Promise<MapDetail> {
    return this.maps.duplicate(mapId, user, dto);
  }

  @Get('maps/:mapId/versions')
  @ApiOperation({ summary: 'Saved versions, newest first' })
  versions(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser): Promise<MapVersionSummary[]> {
    return this.maps.versions(mapId, user);
  }

  @Get('maps/:mapId/versions/:number')
  @ApiOperation({ summary: 'One saved version with its setup' })
  version(@Param('mapId') mapId: string, @Param('number', ParseIntPipe) number: number, @CurrentUser() user: AuthUser): Promise<MapVersionDetail> {
    return this.maps.version(mapId, user, number);
  }

  @Get('maps/:mapId/diff')
  @ApiOperation({ summary: 'Which values changed between two versions' })
  diff(@Param('mapId') mapId: string, @Query() query: DiffQueryDto, @CurrentUser() user: AuthUser): Promise<MapDiffResponse> {
    return this.maps.diff(mapId, user, query.from, query.to);
  }

  @Post('maps/:mapId/versions/:number/restore')
  @HttpCode(200)
  @ApiOperation({ summary: "Make an earlier version's content the newest version" })
  restoreVersion(@Param('mapId') mapId: string, @Param('number', ParseIntPipe) number: number, @CurrentUser() user: AuthUser, @Body() dto: RestoreVersionDto): Promise<MapDetail> {
    return this.maps.restoreVersion(mapId, user, number, dto);
  }

  @Put('maps/:mapId/summary')
  @ApiOperation({ summary: "Attach the summary of the client's last computation" })
  putSummary(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser, @Body() dto: PutResultSummaryDto): Promise<ResultSummary> {
    return this.maps.putSummary(mapId, user, dto);
  }

  @Put('maps/:mapId/thumbnail')
  @ApiOperation({ summary: `Upload the thumbnail (PNG, at most ${MAP_LIMITS.maxThumbnailBytes / 1024} KB)` })
  @ApiConsumes('multipart/form-data')
  @ApiBody({ schema: { type: 'object', required: ['file'], properties: { file: { type: 'string', format: 'binary' } } } })
  @UseInterceptors(FileInterceptor('file', { limits: { fileSize: MAP_LIMITS.maxThumbnailBytes, files: 1, fields: 0 } }))
  putThumbnail(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser, @UploadedFile() file: UploadedBytes | undefined): Promise<{ thumbnailUrl: string }> {
    return this.maps.putThumbnail(mapId, user, file);
  }

  @Get('maps/:mapId/thumbnail')
  @ApiOperation({ summary: 'The thumbnail PNG' })
  async thumbnail(@Param('mapId') mapId: string, @CurrentUser() user: AuthUser, @Res() res: Response): Promise<void> {
    const png = await this.maps.getThumbnail(mapId, user);
    res.setHeader('Content-Type', 'image/png');
    res.setHeader('Cache-Control', 'private, max-age=3600');
    res.send(png);
  }
}
