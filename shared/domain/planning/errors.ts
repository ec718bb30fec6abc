/** Bad input to a planning function; `field` names the offending argument. */
export class PlanningInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'PlanningInputError';
    this.field = field;
  }
}
