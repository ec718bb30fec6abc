import { IsIn, IsOptional, IsString, MaxLength, MinLength, ValidateIf } from 'class-validator';
import { DISPOSITION_DECISIONS, MRB_ACTIONS, type DispositionDecision, type MrbAction, type ProposeDispositionRequest, type SignDispositionRequest } from '../../../shared/api/disposition.ts';

class DecisionFields {
  @IsIn(DISPOSITION_DECISIONS as unknown as string[], { message: `decision must be one of ${DISPOSITION_DECISIONS.join(', ')}` })
  decision: DispositionDecision;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsIn(MRB_ACTIONS as unknown as string[], { message: `mrbAction must be one of ${MRB_ACTIONS.join(', ')}` })
  mrbAction?: MrbAction | null;

  @IsString({ message: 'reason must be text' })
  @MinLength(5, { message: 'reason must say why (at least 5 characters)' })
  @MaxLength(1000)
  reason: string;
}

export class ProposeDispositionDto extends DecisionFields implements ProposeDispositionRequest {}
export class SignDispositionDto extends DecisionFields implements SignDispositionRequest {}
