import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsString,
  IsUUID,
  Max,
  MaxLength,
  Min,
  ValidateNested,
} from 'class-validator';

const finite = { allowNaN: false, allowInfinity: false } as const;

export class SeriesPointDto {
  @IsOptional()
  @IsString()
  @MaxLength(200)
  label?: string;

  /** ΔG° as typed, in the series' `energyUnit`. */
  @IsNumber(finite, { message: 'Field deltaG0 is not a finite number.' })
  deltaG0: number;

  /** k in s⁻¹ (give k or log10k). */
  @IsOptional()
  @IsNumber(finite, { message: 'Field k is not a finite number.' })
  k?: number;

  @IsOptional()
  @IsNumber(finite, { message: 'Field log10k is not a finite number.' })
  @Min(-300)
  @Max(300)
  log10k?: number;

  /** σ of log10 k (≥ 0). */
  @IsOptional()
  @IsNumber(finite)
  @Min(0)
  sigmaLog10k?: number | null;

  @IsOptional()
  @IsUUID()
  pairId?: string | null;
}

export class SeriesModelOptionsDto {
  @IsOptional()
  @IsIn(['marcus', 'mlj'])
  model?: 'marcus' | 'mlj';

  @IsOptional()
  @IsNumber(finite)
  hbarOmega?: number;

  @IsOptional()
  @IsNumber(finite)
  lambdaVib?: number;
}

export class SeriesInputDto {
  @IsString()
  @MaxLength(200)
  name: string;

  /** In `temperatureUnit` (K default). */
  @IsNumber(finite)
  temperature: number;

  @IsOptional()
  @IsIn(['K', 'degC'])
  temperatureUnit?: 'K' | 'degC';

  @IsOptional()
  @IsIn(['eV', 'meV', 'kJ/mol', 'kcal/mol', 'cm-1', 'hartree'])
  energyUnit?: string;

  @IsOptional()
  @IsString()
  @MaxLength(20000)
  notes?: string;

  @IsOptional()
  @ValidateNested()
  @Type(() => SeriesModelOptionsDto)
  modelOptions?: SeriesModelOptionsDto;

  @IsOptional()
  @IsArray()
  @ArrayMaxSize(200)
  @IsUUID('all', { each: true })
  pairIds?: string[];

  @IsArray()
  @ArrayMinSize(0)
  @ArrayMaxSize(2000)
  @ValidateNested({ each: true })
  @Type(() => SeriesPointDto)
  points: SeriesPointDto[];
}

export class SeriesUpdateDto extends SeriesInputDto {
  @IsInt()
  @Min(1)
  version: number;
}

export class SeriesFitDto {
  @IsIn(['marcus', 'mlj'])
  model: 'marcus' | 'mlj';

  /** eV. */
  @IsOptional()
  @IsNumber(finite)
  hbarOmega?: number;

  /** eV. */
  @IsOptional()
  @IsNumber(finite)
  lambdaVib?: number;
}

export class SeriesApplyDto {
  @IsArray()
  @ArrayMinSize(1)
  @ArrayMaxSize(200)
  @IsUUID('all', { each: true })
  pairIds: string[];

  @IsOptional()
  @IsIn(['marcus', 'mlj'])
  model?: 'marcus' | 'mlj';
}
