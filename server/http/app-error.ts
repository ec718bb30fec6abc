import type { FieldError } from '../../shared/api/problem.ts';

/** The one error type services throw. The error middleware turns it into problem+json. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    readonly detail: string,
    readonly errors?: FieldError[],
  ) {
    super(detail);
    this.name = 'AppError';
  }

  static badRequest(detail: string, errors?: FieldError[]) {
    return new AppError(400, 'bad-request', detail, errors);
  }
  static unauthorized(detail = 'Sign in to continue.') {
    return new AppError(401, 'unauthorized', detail);
  }
  static forbidden(detail = 'Your role does not allow this.') {
    return new AppError(403, 'forbidden', detail);
  }
  static notFound(what: string) {
    return new AppError(404, 'not-found', `${what} was not found.`);
  }
  static conflict(detail: string, errors?: FieldError[]) {
    return new AppError(409, 'conflict', detail, errors);
  }
  static unprocessable(detail: string, errors?: FieldError[]) {
    return new AppError(422, 'unprocessable', detail, errors);
  }
}
