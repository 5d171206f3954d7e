import { IsEmail, IsOptional, IsString, Matches, MaxLength, MinLength } from 'class-validator';
import { PASSWORD_MIN_LENGTH } from '@gapwise/contracts';

/** A same-site path such as `/invitations/<token>` (no scheme, no `//host`, no query). */
export const RETURN_PATH = /^\/(?!\/)[A-Za-z0-9._~\-/]*$/;

export class RegisterDto {
  @IsString()
  @MaxLength(254)
  @IsEmail({}, { message: 'must be an e-mail address' })
  email: string;

  @IsString()
  @MinLength(PASSWORD_MIN_LENGTH, {
    message: `must have at least ${PASSWORD_MIN_LENGTH} characters`,
  })
  @MaxLength(200)
  password: string;

  @IsString()
  @MinLength(1, { message: 'must not be empty' })
  @MaxLength(100)
  displayName: string;

  @IsOptional()
  @IsString()
  @MaxLength(300)
  @Matches(RETURN_PATH, { message: 'must be a path of this site such as /invitations/…' })
  returnUrl?: string;
}

export class ConfirmRegistrationDto {
  @IsString()
  @MaxLength(200)
  token: string;
}

export class SignInDto {
  @IsString()
  @MaxLength(254)
  email: string;

  @IsString()
  @MaxLength(200)
  password: string;
}
