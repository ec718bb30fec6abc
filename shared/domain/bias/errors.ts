/** Bad input to a bias calculation; `field` names the offending input. */
export class BiasInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'BiasInputError';
    this.field = field;
  }
}
