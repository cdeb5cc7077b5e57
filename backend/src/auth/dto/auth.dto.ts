import { Transform } from 'class-transformer';
import { IsEmail, IsNotEmpty, IsString, MaxLength, MinLength } from 'class-validator';

export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 128;

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
const normaliseEmail = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim().toLowerCase() : value);

export class EmailField {
  @Transform(normaliseEmail)
  @IsString({ message: 'Enter an e-mail address.' })
  @IsEmail({}, { message: 'Enter a valid e-mail address, such as name@institute.edu.' })
  @MaxLength(254, { message: 'An e-mail address has at most 254 characters.' })
  email: string;
}

export class RegisterDto extends EmailField {
  @Transform(trim)
  @IsString({ message: 'Enter your name.' })
  @IsNotEmpty({ message: 'Enter your name.' })
  @MaxLength(100, { message: 'A name has at most 100 characters.' })
  displayName: string;

  @IsString({ message: 'Choose a password.' })
  @MinLength(PASSWORD_MIN, { message: `A password needs at least ${PASSWORD_MIN} characters.` })
  @MaxLength(PASSWORD_MAX, { message: `A password has at most ${PASSWORD_MAX} characters.` })
  password: string;
}

export class SignInDto extends EmailField {
  @IsString({ message: 'Enter your password.' })
  @IsNotEmpty({ message: 'Enter your password.' })
  @MaxLength(PASSWORD_MAX, { message: `A password has at most ${PASSWORD_MAX} characters.` })
  password: string;
}

export class ForgotPasswordDto extends EmailField {}

export class ResetPasswordDto {
  @IsString({ message: 'The reset link is missing its token.' })
  @IsNotEmpty({ message: 'The reset link is missing its token.' })
  @MaxLength(200, { message: 'The reset link is not valid.' })
  token: string;

  @IsString({ message: 'Choose a new password.' })
  @MinLength(PASSWORD_MIN, { message: `A password needs at least ${PASSWORD_MIN} characters.` })
  @MaxLength(PASSWORD_MAX, { message: `A password has at most ${PASSWORD_MAX} characters.` })
  password: string;
}

export class ChangePasswordDto {
  @IsString({ message: 'Enter your current password.' })
  @IsNotEmpty({ message: 'Enter your current password.' })
  @MaxLength(PASSWORD_MAX, { message: `A password has at most ${PASSWORD_MAX} characters.` })
  currentPassword: string;

  @IsString({ message: 'Choose a new password.' })
  @MinLength(PASSWORD_MIN, { message: `A password needs at least ${PASSWORD_MIN} characters.` })
  @MaxLength(PASSWORD_MAX, { message: `A password has at most ${PASSWORD_MAX} characters.` })
  newPassword: string;
}
