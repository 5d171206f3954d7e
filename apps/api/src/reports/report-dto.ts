import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsOptional,
  IsString,
  IsUUID,
  MaxLength,
  Validate,
} from 'class-validator';
import { NotBlank } from '../workspaces/workspace-dto';

/**
 * `POST /workspaces/:wid/reports`: `pairId` for one pair, `pairIds` (2–50) for a comparison, or
 * `cascadeId` for a cascade (a network of states, issue 17).
 */
export class ReportCreateDto {
  @IsOptional()
  @IsUUID('all', { message: 'cascadeId must be a cascade id' })
  cascadeId?: string;

  @IsOptional()
  @IsUUID('all', { message: 'pairId must be a pair id' })
  pairId?: string;

  @IsOptional()
  @IsArray()
  @ArrayMinSize(2, { message: 'pairIds must list at least 2 pairs for a comparison' })
  @ArrayMaxSize(50)
  @IsUUID('all', { each: true, message: 'each of pairIds must be a pair id' })
  pairIds?: string[];

  @IsOptional()
  @IsString()
  @Validate(NotBlank)
  @MaxLength(200)
  title?: string;
}

/** Optional note with a review decision. */
export class ReportDecisionDto {
  @IsOptional()
  @IsString()
  @MaxLength(4000)
  note?: string;
}

export class ReportCommentDto {
  @IsString()
  @Validate(NotBlank)
  @MaxLength(8000)
  body: string;

  @IsOptional()
  @IsString()
  @MaxLength(60)
  anchor?: string | null;

  @IsOptional()
  @IsUUID('all', { message: 'parentId must be a comment id' })
  parentId?: string | null;
}
