import { IsEmail, IsString, MaxLength, MinLength } from 'class-validator';
import { PASSWORD_MIN_LENGTH } from '@gapwise/contracts';

export class RegisterDto {
  @IsString()
  @MaxLength(254)
  @IsEmail({}, { message: 'must be an e-mail address' })
  email: string;

  @IsString()
  @MinLength(PASSWORD_MIN_LENGTH, { message: `must have at least ${PASSWORD_MIN_LENGTH} characters` })
  @MaxLength(200)
  password: string;

  @IsString()
  @MinLength(1, { message: 'must not be empty' })
  @MaxLength(100)
  displayName: string;
}

export class SignInDto {
  @IsString()
  @MaxLength(254)
  email: string;

  @IsString()
  @MaxLength(200)
  password: string;
}
