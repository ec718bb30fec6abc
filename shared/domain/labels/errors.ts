/**
 * A label or code that cannot be read as it stands. `field` names the input (`text` for the
 * scanned text, `quantity` for DI Q …); `di` names the data identifier when one is at fault.
 */
export class LabelFormatError extends Error {
  readonly field: string;
  readonly di: string | null;

  constructor(message: string, field = 'text', di: string | null = null) {
    super(message);
    this.name = 'LabelFormatError';
    this.field = field;
    this.di = di;
  }
}
