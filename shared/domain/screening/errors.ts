/** Bad input to a screening or stock function; `field` names the offending argument. */
export class ScreeningInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'ScreeningInputError';
    this.field = field;
  }
}
