import {
  IsEmail,
  IsOptional,
  IsString,
  Matches,
  MaxLength,
  MinLength,
  Validate,
  ValidatorConstraint,
  type ValidatorConstraintInterface,
} from 'class-validator';
import { PASSWORD_MAX_BYTES, PASSWORD_MIN_LENGTH, passwordBytes } from '@gapwise/contracts';
import { NotBlank } from '../workspaces/workspace-dto';

/** bcrypt ignores everything after 72 UTF-8 bytes, so a longer new password is refused, not cut. */
@ValidatorConstraint({ name: 'passwordBytes' })
export class FitsBcrypt implements ValidatorConstraintInterface {
  validate(value: unknown): boolean {
    return typeof value !== 'string' || passwordBytes(value) <= PASSWORD_MAX_BYTES;
  }
  defaultMessage(): string {
    return `must be at most ${PASSWORD_MAX_BYTES} bytes in UTF-8 (${PASSWORD_MAX_BYTES} plain letters; accented letters and other scripts take 2–4 bytes each): the rest would be ignored`;
  }
}

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
  @Validate(FitsBcrypt)
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

const newPasswordRules = () => [
  IsString(),
  MinLength(PASSWORD_MIN_LENGTH, {
    message: `must have at least ${PASSWORD_MIN_LENGTH} characters`,
  }),
  Validate(FitsBcrypt),
];
const apply =
  (decorators: PropertyDecorator[]): PropertyDecorator =>
  (target, key) => {
    for (const d of decorators) d(target, key);
  };

export class ChangePasswordDto {
  @IsString()
  @MaxLength(200)
  currentPassword: string;

  @apply(newPasswordRules())
  newPassword: string;
}

export class PasswordResetRequestDto {
  @IsString()
  @MaxLength(254)
  email: string;
}

export class PasswordResetConfirmDto {
  @IsString()
  @MaxLength(200)
  token: string;

  @apply(newPasswordRules())
  newPassword: string;
}

export class UpdateProfileDto {
  @IsString()
  @MaxLength(100)
  @Validate(NotBlank)
  displayName: string;
}

export class DeleteAccountDto {
  @IsString()
  @MaxLength(200)
  password: string;
}
