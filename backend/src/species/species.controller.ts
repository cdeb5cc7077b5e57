import { Body, Controller, Delete, Get, HttpCode, Param, Post, Query, UploadedFile, UseInterceptors } from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import { SPECIES_CSV_COLUMNS, SPECIES_UPLOAD_LIMITS, type SpeciesListDetail, type SpeciesListResponse, type SpeciesListView } from '@fieldbound/shared';
import type { UploadedBytes } from '../common/uploaded-file';
import { type AuthUser, CurrentUser } from '../common/current-user.decorator';
import type { Membership } from '../teams/membership.entity';
import { CurrentMembership, TeamRole } from '../teams/team-role.guard';
import { SearchSpeciesQueryDto, UploadSpeciesListDto } from './dto/species.dto';
import { SpeciesService } from './species.service';

@ApiTags('species')
@ApiBearerAuth()
@Controller()
export class SpeciesController {
  constructor(private readonly species: SpeciesService) {}

  @Get('species/catalogue')
  @ApiOperation({ summary: 'The built-in catalogue of neutral atoms, each number with its source' })
  catalogue(@Query() query: SearchSpeciesQueryDto): Promise<SpeciesListResponse> {
    return this.species.catalogue(query.search);
  }

  @Get('teams/:teamId/species')
  @TeamRole('viewer')
  @ApiOperation({ summary: "The catalogue and the team's own species, in one shape" })
  forTeam(@Param('teamId') teamId: string, @Query() query: SearchSpeciesQueryDto): Promise<SpeciesListResponse> {
    return this.species.forTeam(teamId, query.search);
  }

  @Get('teams/:teamId/species-lists')
  @TeamRole('viewer')
  @ApiOperation({ summary: "The team's species lists" })
  lists(@Param('teamId') teamId: string): Promise<SpeciesListView[]> {
    return this.species.lists(teamId);
  }

  @Post('teams/:teamId/species-lists')
  @TeamRole('editor')
  @ApiOperation({
    summary: 'Import a species list from CSV: all rows or none',
    description: `UTF-8 CSV, at most ${SPECIES_UPLOAD_LIMITS.maxBytes / 1024} KB and ${SPECIES_UPLOAD_LIMITS.maxRows} species; header row with the columns ${SPECIES_CSV_COLUMNS.join(', ')}. A rejected file answers 400 with every problem as { line, column, message }.`,
  })
  @ApiConsumes('multipart/form-data')
  @ApiBody({ schema: { type: 'object', required: ['name', 'file'], properties: { name: { type: 'string' }, file: { type: 'string', format: 'binary' } } } })
  @UseInterceptors(FileInterceptor('file', { limits: { fileSize: SPECIES_UPLOAD_LIMITS.maxBytes, files: 1, fields: 4 } }))
  upload(
    @CurrentMembership() membership: Membership,
    @CurrentUser() user: AuthUser,
    @Body() dto: UploadSpeciesListDto,
    @UploadedFile() file: UploadedBytes | undefined,
  ): Promise<SpeciesListDetail> {
    return this.species.upload(membership.team, user, dto.name, file);
  }

  @Get('teams/:teamId/species-lists/:listId')
  @TeamRole('viewer')
  @ApiOperation({ summary: 'One species list with its species' })
  list(@Param('teamId') teamId: string, @Param('listId') listId: string): Promise<SpeciesListDetail> {
    return this.species.list(teamId, listId);
  }

  @Delete('teams/:teamId/species-lists/:listId')
  @TeamRole('editor')
  @HttpCode(204)
  @ApiOperation({ summary: 'Delete a species list' })
  remove(@Param('teamId') teamId: string, @Param('listId') listId: string): Promise<void> {
    return this.species.remove(teamId, listId);
  }
}
