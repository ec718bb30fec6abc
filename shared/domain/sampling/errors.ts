/** Bad input to a sampling computation; `field` names the offending input (e.g. 'lotSize', 'aql'). */
export class SamplingInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'SamplingInputError';
    this.field = field;
  }
}
