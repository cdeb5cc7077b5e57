import { Controller, Get, Query } from '@nestjs/common';
import { Type } from 'class-transformer';
import { IsDate, IsInt, IsOptional, Max, Min } from 'class-validator';
import type { Membership } from '../teams/membership.entity';
import { CurrentMembership, TeamRole } from '../teams/team-role.guard';
import { AuditService, type AuditEventView } from './audit.service';

export class AuditQueryDto {
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'limit must be a whole number.' })
  @Min(1, { message: 'limit must be at least 1.' })
  @Max(200, { message: 'limit must be at most 200.' })
  limit?: number;

  @IsOptional()
  @Type(() => Date)
  @IsDate({ message: 'before must be an ISO date and time.' })
  before?: Date;
}

/** A team's audit log: owners only (non-members 404, editors and viewers 403). */
@Controller('teams/:teamId/audit')
export class AuditController {
  constructor(private readonly audit: AuditService) {}

  @Get()
  @TeamRole('owner')
  async list(@CurrentMembership() membership: Membership, @Query() query: AuditQueryDto): Promise<{ events: AuditEventView[] }> {
    const events = await this.audit.forTeam(membership.team.id, { limit: query.limit ?? 50, before: query.before });
    return { events };
  }
}
