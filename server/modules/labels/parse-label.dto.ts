import { IsString, MaxLength, MinLength } from 'class-validator';
import type { ParseLabelRequest } from '../../../shared/api/labels.ts';

export class ParseLabelDto implements ParseLabelRequest {
  @IsString({ message: 'text must be the scanned or typed label text' })
  @MinLength(1, { message: 'text is empty: scan a label or type a code' })
  @MaxLength(4000, { message: 'text must be at most 4000 characters' })
  text: string;
}
