import {
  IsIn,
  IsString,
  MaxLength,
  Validate,
  ValidatorConstraint,
  type ValidatorConstraintInterface,
} from 'class-validator';
import { ROLES, type Role } from '@gapwise/contracts';

@ValidatorConstraint({ name: 'notBlank' })
export class NotBlank implements ValidatorConstraintInterface {
  validate(value: unknown): boolean {
    return typeof value === 'string' && value.trim().length > 0;
  }
  defaultMessage(): string {
    return 'must not be empty';
  }
}

export class WorkspaceNameDto {
  @IsString()
  @MaxLength(120)
  @Validate(NotBlank)
  name: string;
}

export class RoleDto {
  @IsIn(ROLES, { message: `must be one of ${ROLES.join(', ')}` })
  role: Role;
}
