import { IsBoolean, IsOptional, IsString, MaxLength, MinLength } from 'class-validator';
import type { CorrectiveActionRequest, SwitchingSettingsRequest } from '../../../shared/api/sampling.ts';

export class CorrectiveActionDto implements CorrectiveActionRequest {
  @IsString({ message: 'note must be text' })
  @MinLength(5, { message: "note must describe the supplier's corrective action (at least 5 characters)" })
  @MaxLength(400)
  note: string;
}

export class SwitchingSettingsDto implements SwitchingSettingsRequest {
  @IsOptional()
  @IsBoolean({ message: 'reducedApproved must be true or false' })
  reducedApproved?: boolean;

  @IsOptional()
  @IsBoolean({ message: 'productionSteady must be true or false' })
  productionSteady?: boolean;
}
