import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
} from 'class-validator';

/** Most measured points a case keeps (the fit takes at most 100; see `fit.electrodeKinetics`). */
export const ELECTRODE_MAX_POINTS = 100;

/** One measured rate constant k(η). */
export class ElectrodePointDto {
  @IsNumber({}, { message: 'Overpotential η (V) must be a number.' })
  @Min(-3, { message: 'Overpotential η (V) must be within ±3 V.' })
  @Max(3, { message: 'Overpotential η (V) must be within ±3 V.' })
  overpotentialV: number;

  @IsNumber({}, { message: 'Rate constant k must be a number.' })
  @Min(Number.MIN_VALUE, { message: 'Rate constant k must be > 0.' })
  @Max(1e30, { message: 'Rate constant k must be ≤ 1e30.' })
  k: number;

  @IsIn(['reduction', 'oxidation'], { message: "Direction must be 'reduction' or 'oxidation'." })
  direction: 'reduction' | 'oxidation';
}

/** An electrode case as the client sends it. */
export class ElectrodeCaseInputDto {
  @IsString()
  @MinLength(1, { message: 'Name must not be empty.' })
  @MaxLength(200)
  name: string;

  @IsString()
  @MinLength(1, { message: 'Redox couple must not be empty.' })
  @MaxLength(200)
  redoxCouple: string;

  @IsString()
  @MinLength(1, { message: 'Electrode must not be empty.' })
  @MaxLength(200)
  electrode: string;

  @IsNumber({}, { message: 'Reorganization energy λ (eV) must be a number.' })
  @Min(0.01, { message: 'Reorganization energy λ (eV) must be between 0.01 and 4 eV.' })
  @Max(4, { message: 'Reorganization energy λ (eV) must be between 0.01 and 4 eV.' })
  lambdaEv: number;

  @IsNumber({}, { message: 'Temperature (K) must be a number.' })
  @Min(1, { message: 'Temperature must be > 0 K (absolute). Did you enter °C?' })
  @Max(2000, { message: 'Temperature (K) must be ≤ 2000 K.' })
  temperatureK: number;

  @IsIn(['k0', 'coupling'], { message: "Rate from must be 'k0' or 'coupling'." })
  rateSource: 'k0' | 'coupling';

  @IsOptional()
  @IsNumber({}, { message: 'Standard rate constant k⁰ must be a number.' })
  @Min(Number.MIN_VALUE, { message: 'Standard rate constant k⁰ must be > 0.' })
  @Max(1e30)
  k0?: number | null;

  @IsOptional()
  @IsIn(['s-1', 'cm s-1'], { message: "Rate unit must be 's-1' or 'cm s-1'." })
  rateUnit?: 's-1' | 'cm s-1';

  @IsOptional()
  @IsNumber({}, { message: 'Electronic coupling |H| (eV) must be a number.' })
  @Min(Number.MIN_VALUE, { message: 'Electronic coupling |H| (eV) must be > 0.' })
  @Max(10)
  couplingEv?: number | null;

  @IsOptional()
  @IsNumber({}, { message: 'Density of states ρ_M (eV⁻¹) must be a number.' })
  @Min(Number.MIN_VALUE, { message: 'Density of states ρ_M (eV⁻¹) must be > 0.' })
  @Max(1000)
  densityOfStatesPerEv?: number | null;

  @IsOptional()
  @IsString()
  @MaxLength(2000)
  provenance?: string;

  @IsOptional()
  @IsArray({ message: 'Measured points must be a list.' })
  @ArrayMaxSize(ELECTRODE_MAX_POINTS, {
    message: `Measured points: at most ${ELECTRODE_MAX_POINTS}.`,
  })
  @ValidateNested({ each: true })
  @Type(() => ElectrodePointDto)
  points?: ElectrodePointDto[];

  @IsOptional()
  @IsString()
  @MaxLength(2000)
  dataNote?: string;

  @IsOptional()
  @IsString()
  @MaxLength(20000)
  notes?: string;
}

export class ElectrodeCaseUpdateDto extends ElectrodeCaseInputDto {
  /** The version the edit started from (409 when someone saved since). */
  @IsInt()
  @Min(1)
  @Max(1_000_000)
  version: number;
}

/** `POST /electrode-cases/{id}/fit`: fit the stored points, or the draft points given. */
export class ElectrodeFitDto {
  @IsOptional()
  @IsArray({ message: 'Measured points must be a list.' })
  @ArrayMaxSize(ELECTRODE_MAX_POINTS, {
    message: `Measured points: at most ${ELECTRODE_MAX_POINTS}.`,
  })
  @ValidateNested({ each: true })
  @Type(() => ElectrodePointDto)
  points?: ElectrodePointDto[];
}

/** `POST /electrode-cases/{id}/apply-fit`: refit and store λ and k⁰ (MHC) as a new version. */
export class ElectrodeApplyFitDto extends ElectrodeFitDto {
  @IsInt()
  @Min(1)
  @Max(1_000_000)
  version: number;

  @IsOptional()
  @IsIn(['mhc'], { message: "Only the 'mhc' fit sets λ and k⁰." })
  model?: 'mhc';
}
