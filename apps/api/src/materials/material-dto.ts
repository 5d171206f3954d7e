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
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
} from 'class-validator';

/** One neighbour of a site (canonical Å and eV; contracts `MaterialNeighbour`). */
export class MaterialNeighbourDto {
  @IsString()
  @MinLength(1, { message: 'Neighbour label must not be empty.' })
  @MaxLength(40)
  label: string;

  @IsOptional()
  @IsNumber({}, { message: 'Neighbour distance must be a number (Å).' })
  @Min(0, { message: 'Neighbour distance must be > 0 Å.' })
  distanceAngstrom?: number | null;

  @IsOptional()
  @IsArray()
  @ArrayMinSize(1)
  @ArrayMaxSize(3, { message: 'Neighbour vector has at most 3 components (x, y, z in Å).' })
  @IsNumber({}, { each: true, message: 'Neighbour vector components must be numbers (Å).' })
  vectorAngstrom?: number[] | null;

  @IsNumber({}, { message: 'Neighbour coupling J must be a number (eV).' })
  couplingEv: number;

  @IsOptional()
  @IsNumber({}, { message: 'σ of a neighbour coupling must be a number (eV).' })
  @Min(0, { message: 'σ of a neighbour coupling must be ≥ 0.' })
  couplingSigmaEv?: number | null;

  @IsOptional()
  @IsNumber({}, { message: 'Site-energy difference ΔG° must be a number (eV).' })
  deltaG0Ev?: number | null;
}

/** A material case as the client sends it. */
export class MaterialInputDto {
  @IsString()
  @MinLength(1, { message: 'Name must not be empty.' })
  @MaxLength(200)
  name: string;

  @IsOptional()
  @IsString()
  @MaxLength(20000)
  notes?: string;

  @IsNumber({}, { message: 'Reorganization energy λ must be a number (eV).' })
  lambdaEv: number;

  @IsOptional()
  @IsNumber({}, { message: 'σ of λ must be a number (eV).' })
  @Min(0, { message: 'σ of λ must be ≥ 0.' })
  lambdaSigmaEv?: number | null;

  @IsNumber({}, { message: 'Temperature must be a number (K).' })
  temperatureK: number;

  @IsIn([1, 2, 3], { message: 'Dimensions n must be 1, 2 or 3.' })
  dimensions: 1 | 2 | 3;

  @IsArray({ message: 'Neighbours must be a list.' })
  @ArrayMinSize(1, { message: 'Neighbours: give at least one neighbour.' })
  @ArrayMaxSize(200, { message: 'Neighbours: at most 200.' })
  @ValidateNested({ each: true })
  @Type(() => MaterialNeighbourDto)
  neighbours: MaterialNeighbourDto[];
}

export class MaterialUpdateDto extends MaterialInputDto {
  /** The version the edit started from (409 when someone saved since). */
  @IsInt()
  @Min(1)
  @Max(1_000_000)
  version: number;
}
