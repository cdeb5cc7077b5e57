import { Transform } from 'class-transformer';
import { IsIn, IsNotEmpty, IsString, MaxLength } from 'class-validator';
import { TEAM_ROLES, type TeamRole } from '../team-role';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

export class TeamNameDto {
  @Transform(trim)
  @IsString({ message: 'Enter a name for the team.' })
  @IsNotEmpty({ message: 'Enter a name for the team.' })
  @MaxLength(100, { message: 'A team name has at most 100 characters.' })
  name: string;
}

export class ChangeRoleDto {
  @IsIn(TEAM_ROLES, { message: `Choose one of the roles: ${TEAM_ROLES.join(', ')}.` })
  role: TeamRole;
}
