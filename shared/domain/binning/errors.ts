/** Bad input to a binning function; `field` names the offending argument. */
export class BinningInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'BinningInputError';
    this.field = field;
  }
}
