import { ValidatorConstraint, type ValidationArguments, type ValidatorConstraintInterface } from 'class-validator';

/**
 * A few very common passwords of 10 characters or more (keyboard walks, digit runs and the like,
 * as found at the top of published breach-corpus frequency lists). Not a full blocklist: the
 * length rule does most of the work; this refuses the guesses an attacker tries first.
 */
const COMMON = new Set([
  '1234567890', '0123456789', '0987654321', '1111111111', '12345678910', '123456789a', '1234567890a',
  'qwertyuiop', 'qwerty1234', 'qwerty12345', '1q2w3e4r5t', '1qaz2wsx3edc', 'zaq12wsxcde3', 'asdfghjkl1',
  'password12', 'password123', 'password1234', 'passw0rd123', 'p@ssw0rd123', 'iloveyou12', 'iloveyou123',
  'abcdefghij', 'abc1234567', 'abcd123456', 'letmein123', 'welcome123', 'changeme123', 'administrator',
  'football123', 'baseball123', 'sunshine123', 'princess123', 'monkey12345', 'dragon12345',
]);

/** Why a password is refused, or null. Rules: 10–200 characters (the DTO), plus these. */
export function passwordProblem(password: string, person: { email?: unknown; name?: unknown }): string | null {
  const p = password.toLowerCase();
  if (new Set(password).size < 5) return 'password must use at least 5 different characters';
  if (COMMON.has(p)) return 'password is one of the most common passwords; choose another';
  const email = typeof person.email === 'string' ? person.email.trim().toLowerCase() : '';
  const local = email.split('@')[0] ?? '';
  if (email && (p.includes(email) || (local.length >= 4 && p.includes(local)))) return 'password must not contain the e-mail address';
  const name = typeof person.name === 'string' ? person.name.trim().toLowerCase() : '';
  if (name.length >= 4 && p.includes(name.replace(/\s+/g, ' '))) return 'password must not contain the name';
  return null;
}

/** class-validator constraint on `password` that reads the e-mail and name of the same body. */
@ValidatorConstraint({ name: 'passwordRules', async: false })
export class PasswordRules implements ValidatorConstraintInterface {
  validate(value: unknown, args: ValidationArguments): boolean {
    return typeof value !== 'string' || passwordProblem(value, args.object as { email?: unknown; name?: unknown }) === null;
  }

  defaultMessage(args: ValidationArguments): string {
    return passwordProblem(String(args.value), args.object as { email?: unknown; name?: unknown }) ?? 'password is not allowed';
  }
}
