import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsDefined,
  IsIn,
  IsInt,
  IsNumber,
  IsObject,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  Validate,
  ValidateNested,
} from 'class-validator';
import {
  PAIR_STATUSES,
  PARAMETER_KINDS,
  PROVENANCE_KINDS,
  RATE_MODELS,
  type PairStatus,
  type ParameterKind,
  type ProvenanceKind,
  type RateModel,
} from '@gapwise/contracts';
import { NotBlank } from '../workspaces/workspace-dto';

const finite = { allowNaN: false, allowInfinity: false } as const;
export const MAX_VERSION = 2_147_483_647;
export const TEMPERATURE_UNITS = ['K', 'degC'] as const;
const KINDS = Object.keys(PARAMETER_KINDS) as ParameterKind[];

export class SourceRefDto {
  @IsString()
  @MaxLength(40)
  type: string;

  @IsString()
  @MaxLength(200)
  id: string;
}

export class ProvenanceDto {
  @IsIn(PROVENANCE_KINDS, { message: `must be one of ${PROVENANCE_KINDS.join(', ')}` })
  kind: ProvenanceKind;

  @IsOptional()
  @IsString()
  @MaxLength(1000)
  citation?: string | null;

  @IsOptional()
  @IsString()
  @MaxLength(100)
  methodId?: string | null;

  @IsOptional()
  @IsObject()
  methodInputs?: Record<string, unknown> | null;

  @IsOptional()
  @IsArray()
  @ArrayMaxSize(50)
  @ValidateNested({ each: true })
  @Type(() => SourceRefDto)
  sources?: SourceRefDto[] | null;

  @IsOptional()
  @IsString()
  @MaxLength(2000)
  note?: string | null;
}

export class ParameterDto {
  @IsIn(KINDS, { message: 'must be a known parameter kind' })
  kind: ParameterKind;

  @IsNumber(finite, { message: 'must be a finite number (canonical unit)' })
  value: number;

  @IsString()
  @MaxLength(20)
  unit: string;

  @IsOptional()
  @IsNumber(finite)
  @Min(0)
  uncertainty?: number | null;

  @IsDefined()
  @IsObject()
  @ValidateNested()
  @Type(() => ProvenanceDto)
  provenance: ProvenanceDto;
}

/** Fields shared by create, replace and patch; every one optional here, required below. */
class PairFieldsDto {
  @IsString()
  @MaxLength(200)
  @Validate(NotBlank)
  name: string;

  @IsString()
  @MaxLength(200)
  @Validate(NotBlank)
  donor: string;

  @IsString()
  @MaxLength(200)
  @Validate(NotBlank)
  acceptor: string;

  @IsString()
  @MaxLength(200)
  medium: string;

  @IsNumber(finite, { message: 'must be a finite number in kelvin' })
  @Min(1e-6, { message: 'must be greater than 0 K' })
  @Max(10000)
  temperature: number;

  @IsOptional()
  @IsIn(TEMPERATURE_UNITS, { message: `must be one of ${TEMPERATURE_UNITS.join(', ')}` })
  temperatureUnit?: string;

  @IsOptional()
  @IsString()
  @MaxLength(20000)
  notes?: string;

  @IsOptional()
  @IsIn(PAIR_STATUSES, { message: `must be one of ${PAIR_STATUSES.join(', ')}` })
  status?: PairStatus;

  @IsOptional()
  @IsArray()
  @ArrayMaxSize(30)
  @IsString({ each: true })
  @MaxLength(40, { each: true })
  tags?: string[];

  @IsOptional()
  @IsIn(RATE_MODELS, { message: `must be one of ${RATE_MODELS.join(', ')}` })
  model?: RateModel;

  @IsArray()
  @ArrayMaxSize(60)
  @ValidateNested({ each: true })
  @Type(() => ParameterDto)
  parameters: ParameterDto[];
}

export class PairInputDto extends PairFieldsDto {}

export class PairUpdateDto extends PairFieldsDto {
  @IsInt()
  @Min(1)
  @Max(MAX_VERSION)
  version: number;
}

/** PATCH: `version` plus any subset of the pair's fields (parameters, when given, replace all). */
export class PairPatchDto {
  @IsInt()
  @Min(1)
  @Max(MAX_VERSION)
  version: number;

  @IsOptional() @IsString() @MaxLength(200) @Validate(NotBlank) name?: string;
  @IsOptional() @IsString() @MaxLength(200) @Validate(NotBlank) donor?: string;
  @IsOptional() @IsString() @MaxLength(200) @Validate(NotBlank) acceptor?: string;
  @IsOptional() @IsString() @MaxLength(200) medium?: string;

  @IsOptional()
  @IsNumber(finite, { message: 'must be a finite number in kelvin' })
  @Min(1e-6, { message: 'must be greater than 0 K' })
  @Max(10000)
  temperature?: number;

  @IsOptional()
  @IsIn(TEMPERATURE_UNITS, { message: `must be one of ${TEMPERATURE_UNITS.join(', ')}` })
  temperatureUnit?: string;

  @IsOptional() @IsString() @MaxLength(20000) notes?: string;

  @IsOptional()
  @IsIn(PAIR_STATUSES, { message: `must be one of ${PAIR_STATUSES.join(', ')}` })
  status?: PairStatus;

  @IsOptional()
  @IsArray()
  @ArrayMaxSize(30)
  @IsString({ each: true })
  @MaxLength(40, { each: true })
  tags?: string[];

  @IsOptional()
  @IsIn(RATE_MODELS, { message: `must be one of ${RATE_MODELS.join(', ')}` })
  model?: RateModel;

  @IsOptional()
  @IsArray()
  @ArrayMaxSize(60)
  @ValidateNested({ each: true })
  @Type(() => ParameterDto)
  parameters?: ParameterDto[];
}
