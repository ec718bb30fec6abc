/** Bad input to a kitting function; `field` names the offending argument. */
export class KittingInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'KittingInputError';
    this.field = field;
  }
}
