import { plainToInstance, type ClassConstructor } from 'class-transformer';
import { validate, type ValidationError } from 'class-validator';
import type { FieldError } from '../../shared/api/problem.ts';
import { AppError } from './app-error.ts';
import { unstorableTextErrors } from './refuse-unstorable-text.ts';

function flatten(errors: ValidationError[], prefix = ''): FieldError[] {
  const out: FieldError[] = [];
  for (const e of errors) {
    const field = prefix ? `${prefix}.${e.property}` : e.property;
    if (e.constraints) {
      for (const [key, message] of Object.entries(e.constraints)) {
        out.push({ field, message: key === 'whitelistValidation' ? `${field} is not a known field` : message });
      }
    }
    if (e.children?.length) out.push(...flatten(e.children, field));
  }
  return out;
}

/**
 * Validates a plain body against a DTO class: unknown fields are refused (400), and every
 * failing field is named. Returns the typed instance.
 */
export async function parseBody<T extends object>(cls: ClassConstructor<T>, body: unknown): Promise<T> {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) {
    throw AppError.badRequest('The request body must be a JSON object.');
  }
  // Also covers bodies that did not come as JSON (multipart form fields parsed by a route).
  const unstorable = unstorableTextErrors(body);
  if (unstorable.length) throw AppError.badRequest(`Text that cannot be stored: check ${unstorable.map((e) => e.field).join(', ')}.`, unstorable);
  const instance = plainToInstance(cls, body, { enableImplicitConversion: false });
  const errors = await validate(instance, { whitelist: true, forbidNonWhitelisted: true, forbidUnknownValues: true });
  if (errors.length) {
    const fieldErrors = flatten(errors);
    throw AppError.badRequest(`Check ${[...new Set(fieldErrors.map((f) => f.field))].join(', ')}.`, fieldErrors);
  }
  return instance;
}
