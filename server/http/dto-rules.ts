import { Transform } from 'class-transformer';
import { ValidateIf } from 'class-validator';

/** Applies several property decorators as one, so create and update DTOs share their field rules. */
export function Rules(...decorators: PropertyDecorator[]): PropertyDecorator {
  return (target, key) => {
    for (const d of decorators) d(target, key);
  };
}

/** For PATCH bodies: the field may be left out, but when sent it must pass its rules (null included). */
export const OptionalNotNull = (): PropertyDecorator => ValidateIf((_o, v) => v !== undefined);

/** Trims surrounding white space of a string value before validation. */
export const Trim = (): PropertyDecorator => Transform(({ value }) => (typeof value === 'string' ? value.trim() : value));

/** Trims a string and turns an empty one into null (optional text fields). */
export const TrimToNull = (): PropertyDecorator =>
  Transform(({ value }) => (typeof value === 'string' ? value.trim() || null : value));

export const FINITE = { allowNaN: false, allowInfinity: false } as const;
