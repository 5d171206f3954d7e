import {
  IsInt,
  IsObject,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  MinLength,
} from 'class-validator';

/** A cascade as the client sends it: a name, notes and the `kinetics.network` inputs. */
export class CascadeInputDto {
  @IsString()
  @MinLength(1, { message: 'Name must not be empty.' })
  @MaxLength(200)
  name: string;

  @IsOptional()
  @IsString()
  @MaxLength(20000)
  notes?: string;

  /** The `kinetics.network` inputs (states, links, initial, temperature, …; CALC-API.md). */
  @IsObject({ message: 'Field network must be an object: the kinetics.network inputs.' })
  network: Record<string, unknown>;

  /**
   * The web editor's design (how each energy was derived, σ of the inputs, the pair a step was
   * taken from), stored beside the network; never computed from.
   */
  @IsOptional()
  @IsObject({ message: 'Field design must be an object.' })
  design?: Record<string, unknown>;
}

export class CascadeUpdateDto extends CascadeInputDto {
  /** The version the edit started from (409 when someone saved since). */
  @IsInt()
  @Min(1)
  @Max(1_000_000)
  version: number;
}
