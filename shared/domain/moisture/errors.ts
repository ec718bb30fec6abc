/** Bad input to a moisture-sensitivity computation; `field` names the offending input. */
export class MoistureInputError extends Error {
  readonly field: string;

  constructor(message: string, field: string) {
    super(message);
    this.name = 'MoistureInputError';
    this.field = field;
  }
}
