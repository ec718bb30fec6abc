/** Bad input to an ESD computation; `field` names the offending input. */
export class EsdInputError extends Error {
  readonly field: string;

  constructor(message: string, field: string) {
    super(message);
    this.name = 'EsdInputError';
    this.field = field;
  }
}
