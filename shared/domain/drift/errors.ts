/** Bad input to a drift function; `field` names the offending argument. */
export class DriftInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'DriftInputError';
    this.field = field;
  }
}
