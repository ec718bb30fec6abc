/** Bad input to a normalisation function; `field` names the offending argument. */
export class NormaliseInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'NormaliseInputError';
    this.field = field;
  }
}

/** Throws NormaliseInputError naming `field` unless value is a finite number. */
export function assertFinite(value: number, field: string): void {
  if (!Number.isFinite(value)) throw new NormaliseInputError(field, `${field} must be a finite number`);
}
