import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsBoolean, IsISO8601, IsOptional, ValidateIf } from 'class-validator';

export class CreateViewingLinkDto {
  @ApiPropertyOptional({ type: String, format: 'date-time', nullable: true, description: 'When the link stops working (ISO 8601, in the future); omit or null for no expiry.' })
  @IsOptional()
  @ValidateIf((_, v) => v !== null)
  @IsISO8601({ strict: true }, { message: 'expiresAt must be an ISO 8601 date and time, e.g. 2027-01-31T18:00:00Z.' })
  expiresAt?: string | null;

  @ApiPropertyOptional({ default: false, description: "Whether the link also shows the map's pins (never their threads or authors)." })
  @IsOptional()
  @IsBoolean({ message: 'includePins must be true or false.' })
  includePins?: boolean;
}
