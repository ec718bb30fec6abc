import { IsIn, IsISO8601, IsOptional } from 'class-validator';
import type { OpenDryBagRequest } from '../../../shared/api/lots.ts';

export class OpenDryBagDto implements OpenDryBagRequest {
  @IsIn(['opened'], { message: "state must be 'opened': resealing and baking follow J-STD-033 and your local procedure" })
  state: 'opened';

  @IsOptional()
  @IsISO8601({ strict: true }, { message: 'openedAt must be an ISO 8601 date and time' })
  openedAt?: string;
}
