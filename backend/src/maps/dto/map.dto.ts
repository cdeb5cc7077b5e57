import { ApiProperty, ApiPropertyOptional, PartialType } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import { ArrayMaxSize, ArrayUnique, IsArray, IsIn, IsInt, IsNotEmpty, IsObject, IsOptional, IsString, IsUUID, Matches, Max, MaxLength, Min, ValidateNested, IsNumber } from 'class-validator';
import { MAP_LIMITS, MAP_SORT_KEYS, type MapSetup, type MapSortKey } from '@fieldbound/shared';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
const trimAll = ({ value }: { value: unknown }) => (Array.isArray(value) ? value.map((v) => (typeof v === 'string' ? v.trim() : v)) : value);

const SETUP_DOC = 'The full map setup (see the shared MapSetup schema, schemaVersion 1); validated field by field, unknown fields are errors.';

export class CreateMapDto {
  @ApiProperty({ maxLength: MAP_LIMITS.maxTitleLength })
  @Transform(trim)
  @IsString({ message: 'Give the map a title.' })
  @IsNotEmpty({ message: 'Give the map a title.' })
  @MaxLength(MAP_LIMITS.maxTitleLength, { message: `A title has at most ${MAP_LIMITS.maxTitleLength} characters.` })
  title: string;

  @ApiPropertyOptional({ maxLength: MAP_LIMITS.maxDescriptionLength })
  @IsOptional()
  @IsString({ message: 'The description must be text.' })
  @MaxLength(MAP_LIMITS.maxDescriptionLength, { message: `A description has at most ${MAP_LIMITS.maxDescriptionLength} characters.` })
  description?: string;

  @ApiPropertyOptional({ type: [String], maxItems: MAP_LIMITS.maxTags })
  @IsOptional()
  @Transform(trimAll)
  @IsArray({ message: 'Tags must be a list of words.' })
  @ArrayMaxSize(MAP_LIMITS.maxTags, { message: `At most ${MAP_LIMITS.maxTags} tags.` })
  @ArrayUnique({ message: 'A tag is listed twice.' })
  @IsString({ each: true, message: 'Each tag must be text.' })
  @IsNotEmpty({ each: true, message: 'A tag must not be empty.' })
  @MaxLength(MAP_LIMITS.maxTagLength, { each: true, message: `A tag has at most ${MAP_LIMITS.maxTagLength} characters.` })
  tags?: string[];

  @ApiProperty({ type: 'object', additionalProperties: true, description: SETUP_DOC })
  @IsObject({ message: 'The setup must be an object.' })
  setup: MapSetup;
}

/** Every field of a new map, each optional, plus the version the edit is based on. */
export class UpdateMapDto extends PartialType(CreateMapDto) {
  @ApiProperty({ description: 'The version this edit is based on; a stale one gets 409 with the current map.' })
  @IsInt({ message: 'expectedVersion must be the whole version number you last read.' })
  @Min(1)
  expectedVersion: number;
}

export class ListMapsQueryDto {
  @ApiPropertyOptional({ description: 'Text searched in titles and tags (case-insensitive).' })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(100)
  search?: string;

  @ApiPropertyOptional({ description: 'Only maps carrying exactly this tag.' })
  @IsOptional()
  @IsString()
  @MaxLength(MAP_LIMITS.maxTagLength)
  tag?: string;

  @ApiPropertyOptional({ enum: MAP_SORT_KEYS, default: 'updatedAt' })
  @IsOptional()
  @IsIn(MAP_SORT_KEYS, { message: `sort must be one of ${MAP_SORT_KEYS.join(', ')}.` })
  sort?: MapSortKey;

  @ApiPropertyOptional({ enum: ['asc', 'desc'], description: 'Default: desc for dates, asc for titles.' })
  @IsOptional()
  @IsIn(['asc', 'desc'], { message: 'order must be asc or desc.' })
  order?: 'asc' | 'desc';

  @ApiPropertyOptional({ default: 50, maximum: MAP_LIMITS.maxPageSize })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(MAP_LIMITS.maxPageSize)
  limit?: number;

  @ApiPropertyOptional({ default: 0 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(0)
  offset?: number;
}

export class DuplicateMapDto {
  @ApiPropertyOptional({ description: "Target team (default: the map's own team); you must be an editor or owner there." })
  @IsOptional()
  @IsUUID('all', { message: 'teamId must be a team id.' })
  teamId?: string;

  @ApiPropertyOptional({ maxLength: MAP_LIMITS.maxTitleLength })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @IsNotEmpty({ message: 'The title must not be empty.' })
  @MaxLength(MAP_LIMITS.maxTitleLength)
  title?: string;
}

export class RestoreVersionDto {
  @ApiProperty({ description: 'The version the map is at now, as you last read it.' })
  @IsInt({ message: 'expectedVersion must be the whole version number you last read.' })
  @Min(1)
  expectedVersion: number;
}

export class DiffQueryDto {
  @ApiProperty()
  @Type(() => Number)
  @IsInt({ message: 'from must be a version number.' })
  @Min(1)
  from: number;

  @ApiProperty()
  @Type(() => Number)
  @IsInt({ message: 'to must be a version number.' })
  @Min(1)
  to: number;
}

export class ResultCountsDto {
  @ApiProperty() @IsInt() @Min(0) bound: number;
  @ApiProperty() @IsInt() @Min(0) resonance: number;
  @ApiProperty() @IsInt() @Min(0) unbound: number;
}

export class PutResultSummaryDto {
  @ApiProperty({ maxLength: 40 })
  @IsString()
  @IsNotEmpty()
  @MaxLength(40)
  engineVersion: string;

  @ApiProperty({ description: 'setupFingerprint(setup) of the computed setup: 16 hex digits.' })
  @Matches(/^[0-9a-f]{16}$/, { message: 'setupFingerprint must be the 16 hex digits of setupFingerprint(setup).' })
  setupFingerprint: string;

  @ApiProperty({ type: ResultCountsDto })
  @ValidateNested()
  @Type(() => ResultCountsDto)
  counts: ResultCountsDto;

  @ApiProperty({ description: 'Wall time of the computation, ms.' })
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(0)
  @Max(86_400_000)
  computationMs: number;
}
