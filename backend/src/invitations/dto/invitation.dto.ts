import { Transform } from 'class-transformer';
import { IsEmail, IsIn, IsNotEmpty, IsString, MaxLength, MinLength } from 'class-validator';
import { TEAM_ROLES, type TeamRole } from '../../teams/team-role';
import { PASSWORD_MAX, PASSWORD_MIN } from '../../auth/dto/auth.dto';

export class CreateInvitationDto {
  @Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim().toLowerCase() : value))
  @IsString({ message: 'Enter the e-mail address to invite.' })
  @IsEmail({}, { message: 'Enter a valid e-mail address, such as name@institute.edu.' })
  @MaxLength(254, { message: 'An e-mail address has at most 254 characters.' })
  email: string;

  @IsIn(TEAM_ROLES, { message: `Choose one of the roles: ${TEAM_ROLES.join(', ')}.` })
  role: TeamRole;
}

/** Creating an account from an invitation: the address is the invited one. */
export class AcceptWithNewAccountDto {
  @Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value))
  @IsString({ message: 'Enter your name.' })
  @IsNotEmpty({ message: 'Enter your name.' })
  @MaxLength(100, { message: 'A name has at most 100 characters.' })
  displayName: string;

  @IsString({ message: 'Choose a password.' })
  @MinLength(PASSWORD_MIN, { message: `A password needs at least ${PASSWORD_MIN} characters.` })
  @MaxLength(PASSWORD_MAX, { message: `A password has at most ${PASSWORD_MAX} characters.` })
  password: string;
}
