import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsNotEmpty, IsOptional, IsString, MaxLength } from 'class-validator';
import { SPECIES_UPLOAD_LIMITS } from '@fieldbound/shared';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

/** The text fields of the multipart upload beside the `file` part. */
export class UploadSpeciesListDto {
  @ApiProperty({ maxLength: SPECIES_UPLOAD_LIMITS.maxListNameLength, description: 'Name of the new list, unique in the team.' })
  @Transform(trim)
  @IsString({ message: 'Give the list a name.' })
  @IsNotEmpty({ message: 'Give the list a name.' })
  @MaxLength(SPECIES_UPLOAD_LIMITS.maxListNameLength, { message: `A list name has at most ${SPECIES_UPLOAD_LIMITS.maxListNameLength} characters.` })
  name: string;
}

export class SearchSpeciesQueryDto {
  @ApiPropertyOptional({ description: 'Text searched in names and symbols (case-insensitive).' })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(80)
  search?: string;
}
