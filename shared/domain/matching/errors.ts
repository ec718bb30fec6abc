/** Bad input to a matching function; `field` names the offending input (e.g. `parts[3].hfe`). */
export class MatchingInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'MatchingInputError';
    this.field = field;
  }
}
