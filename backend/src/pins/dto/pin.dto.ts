import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsIn, IsInt, IsNotEmpty, IsObject, IsOptional, IsString, MaxLength, Min, ValidateIf } from 'class-validator';
import { PIN_LIMITS, PIN_STATUSES, type PinGeometry, type PinStatus } from '@fieldbound/shared';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

const GEOMETRY_DOC =
  'In physical units: { kind: "point", at: { alpha, fieldTesla } } | { kind: "rect", min, max } | { kind: "polygon", vertices: [3…200 points] }; alpha in a0^3, fieldTesla in T.';

export class CreatePinDto {
  @ApiProperty({ type: 'object', additionalProperties: true, description: GEOMETRY_DOC })
  @IsObject({ message: 'The geometry must be a point, a rect or a polygon.' })
  geometry: PinGeometry;

  @ApiProperty({ maxLength: PIN_LIMITS.maxTitleLength })
  @Transform(trim)
  @IsString({ message: 'Give the pin a title.' })
  @IsNotEmpty({ message: 'Give the pin a title.' })
  @MaxLength(PIN_LIMITS.maxTitleLength, { message: `A title has at most ${PIN_LIMITS.maxTitleLength} characters.` })
  title: string;

  @ApiPropertyOptional({ maxLength: PIN_LIMITS.maxBodyLength, description: 'Plain text; `@name@example.org` notifies that team member.' })
  @IsOptional()
  @IsString({ message: 'The text must be text.' })
  @MaxLength(PIN_LIMITS.maxBodyLength, { message: `The text has at most ${PIN_LIMITS.maxBodyLength} characters.` })
  body?: string;

  @ApiPropertyOptional({ maxLength: PIN_LIMITS.maxCategoryLength, nullable: true })
  @IsOptional()
  @ValidateIf((_, v) => v !== null)
  @Transform(trim)
  @IsString({ message: 'The category must be text.' })
  @IsNotEmpty({ message: 'Leave the category out, or give it a name.' })
  @MaxLength(PIN_LIMITS.maxCategoryLength, { message: `A category has at most ${PIN_LIMITS.maxCategoryLength} characters.` })
  category?: string | null;
}

export class UpdatePinDto {
  @ApiProperty({ description: 'The version this edit is based on; a stale one gets 409 with the current pin.' })
  @IsInt({ message: 'expectedVersion must be the whole version number you last read.' })
  @Min(1)
  expectedVersion: number;

  @ApiPropertyOptional({ type: 'object', additionalProperties: true, description: GEOMETRY_DOC })
  @IsOptional()
  @IsObject({ message: 'The geometry must be a point, a rect or a polygon.' })
  geometry?: PinGeometry;

  @ApiPropertyOptional({ maxLength: PIN_LIMITS.maxTitleLength })
  @IsOptional()
  @Transform(trim)
  @IsString({ message: 'Give the pin a title.' })
  @IsNotEmpty({ message: 'Give the pin a title.' })
  @MaxLength(PIN_LIMITS.maxTitleLength, { message: `A title has at most ${PIN_LIMITS.maxTitleLength} characters.` })
  title?: string;

  @ApiPropertyOptional({ maxLength: PIN_LIMITS.maxBodyLength })
  @IsOptional()
  @IsString({ message: 'The text must be text.' })
  @MaxLength(PIN_LIMITS.maxBodyLength, { message: `The text has at most ${PIN_LIMITS.maxBodyLength} characters.` })
  body?: string;

  @ApiPropertyOptional({ maxLength: PIN_LIMITS.maxCategoryLength, nullable: true })
  @IsOptional()
  @ValidateIf((_, v) => v !== null)
  @Transform(trim)
  @IsString({ message: 'The category must be text.' })
  @IsNotEmpty({ message: 'Use null to clear the category.' })
  @MaxLength(PIN_LIMITS.maxCategoryLength, { message: `A category has at most ${PIN_LIMITS.maxCategoryLength} characters.` })
  category?: string | null;

  @ApiPropertyOptional({ enum: PIN_STATUSES })
  @IsOptional()
  @IsIn(PIN_STATUSES, { message: 'status must be open or resolved.' })
  status?: PinStatus;
}

export class CreateReplyDto {
  @ApiProperty({ maxLength: PIN_LIMITS.maxBodyLength, description: 'Plain text; `@name@example.org` notifies that team member.' })
  @IsString({ message: 'Write a reply.' })
  @Transform(({ value }: { value: unknown }) => (typeof value === 'string' && value.trim() === '' ? '' : value))
  @IsNotEmpty({ message: 'Write a reply.' })
  @MaxLength(PIN_LIMITS.maxBodyLength, { message: `A reply has at most ${PIN_LIMITS.maxBodyLength} characters.` })
  body: string;
}

export class ListPinsQueryDto {
  @ApiPropertyOptional({ enum: PIN_STATUSES })
  @IsOptional()
  @IsIn(PIN_STATUSES, { message: 'status must be open or resolved.' })
  status?: PinStatus;
}
