import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  MinLength,
  NotEquals,
} from 'class-validator';
import {
  BIN_LABEL_STOCKS,
  CONTAINER_KINDS,
  type AdjustContainerRequest,
  type BinLabelsRequest,
  type CloseContainerRequest,
  type ContainerKind,
  type MoveContainerRequest,
  type PlaceScreenedRequest,
  type ScrapContainerRequest,
  type ScreeningSetupRequest,
} from '../../../shared/api/bins.ts';
import { Trim } from '../../http/dto-rules.ts';

const REASON_MIN = 3;

export class MoveContainerDto implements MoveContainerRequest {
  @Trim()
  @IsString({ message: 'toLocation must be text' })
  @MinLength(1, { message: 'toLocation must name the storage location' })
  @MaxLength(60, { message: 'toLocation must be at most 60 characters' })
  toLocation: string;

  @IsOptional()
  @IsInt({ message: 'expectedVersion must be a whole number' })
  @Min(1)
  expectedVersion?: number;
}

export class AdjustContainerDto implements AdjustContainerRequest {
  @IsInt({ message: 'delta must be a whole number of parts' })
  @NotEquals(0, { message: 'delta must not be zero' })
  @Min(-100000)
  @Max(100000)
  delta: number;

  @Trim()
  @IsString({ message: 'reason must be text' })
  @MinLength(REASON_MIN, { message: `reason must say why (at least ${REASON_MIN} characters)` })
  @MaxLength(300)
  reason: string;

  @IsOptional()
  @IsInt({ message: 'expectedVersion must be a whole number' })
  @Min(1)
  expectedVersion?: number;
}

export class ScrapContainerDto implements ScrapContainerRequest {
  @IsOptional()
  @IsInt({ message: 'quantity must be a whole number of parts' })
  @Min(1, { message: 'quantity must be 1 or more' })
  @Max(100000)
  quantity?: number;

  @IsOptional()
  @IsArray({ message: 'positions must be a list of position numbers' })
  @ArrayMinSize(1, { message: 'positions must name at least one position' })
  @ArrayMaxSize(100000)
  @IsInt({ each: true, message: 'each position must be a whole number' })
  @Min(1, { each: true, message: 'each position must be 1 or more' })
  positions?: number[];

  @Trim()
  @IsString({ message: 'reason must be text' })
  @MinLength(REASON_MIN, { message: `reason must say why (at least ${REASON_MIN} characters)` })
  @MaxLength(300)
  reason: string;

  @IsOptional()
  @IsInt({ message: 'expectedVersion must be a whole number' })
  @Min(1)
  expectedVersion?: number;
}

export class CloseContainerDto implements CloseContainerRequest {
  @IsOptional()
  @Trim()
  @IsString({ message: 'reason must be text' })
  @MaxLength(300)
  reason?: string;
}

export class ScreeningSetupDto implements ScreeningSetupRequest {
  @IsIn(CONTAINER_KINDS as unknown as ContainerKind[], { message: `kind must be one of ${CONTAINER_KINDS.join(', ')}` })
  kind: ContainerKind;

  @IsInt({ message: 'capacity must be a whole number' })
  @Min(1, { message: 'capacity must be 1 or more' })
  @Max(100000, { message: 'capacity must be at most 100 000' })
  capacity: number;

  @IsBoolean({ message: 'hasPositions must be true or false' })
  hasPositions: boolean;

  @Trim()
  @IsString({ message: 'location must be text' })
  @MinLength(1, { message: 'location must name where new containers are kept' })
  @MaxLength(60)
  location: string;
}

export class PlaceScreenedDto implements PlaceScreenedRequest {
  @IsOptional()
  @IsBoolean({ message: 'includeSample must be true or false' })
  includeSample?: boolean;
}

export const MAX_LABELS_PER_JOB = 2000;

export class BinLabelsDto implements BinLabelsRequest {
  @IsArray({ message: 'containerIds must be a list of container ids' })
  @ArrayMinSize(1, { message: 'containerIds must name at least one container' })
  @ArrayMaxSize(MAX_LABELS_PER_JOB, { message: `at most ${MAX_LABELS_PER_JOB} labels per job` })
  @IsInt({ each: true, message: 'each container id must be a whole number' })
  @Min(1, { each: true, message: 'each container id must be 1 or more' })
  containerIds: number[];

  @IsIn(BIN_LABEL_STOCKS.map((s) => s.id), { message: `stock must be one of ${BIN_LABEL_STOCKS.map((s) => s.id).join(', ')}` })
  stock: string;

  @IsOptional()
  @IsInt({ message: 'startPosition must be a whole number' })
  @Min(1, { message: 'startPosition must be 1 or more' })
  startPosition?: number;
}
