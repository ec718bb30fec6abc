import type { RequestHandler } from 'express';
import type { FieldError } from '../../shared/api/problem.ts';
import { AppError } from './app-error.ts';

const NUL = '\u0000';
/** A high surrogate not followed by a low one, or a low one not preceded by a high one. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

function problemOf(text: string): string | null {
  if (text.includes(NUL)) return 'contains a NUL character (U+0000)';
  if (LONE_SURROGATE.test(text)) return 'contains an unpaired surrogate (not valid Unicode text)';
  return null;
}

function walk(value: unknown, field: string, out: FieldError[], depth = 0): void {
  if (out.length >= 20 || depth > 20) return;
  if (typeof value === 'string') {
    const problem = problemOf(value);
    if (problem) out.push({ field, message: `${field} ${problem}` });
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => walk(v, `${field}[${i}]`, out, depth + 1));
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      const name = field ? `${field}.${k}` : k;
      if (problemOf(k)) out.push({ field: JSON.stringify(k).slice(1, -1), message: `a field name ${problemOf(k)}` });
      else walk(v, name, out, depth + 1);
    }
  }
}

/** The fields of a parsed value (JSON body, form fields) whose text PostgreSQL cannot store. */
export function unstorableTextErrors(value: unknown): FieldError[] {
  const errors: FieldError[] = [];
  walk(value, '', errors);
  return errors;
}

/**
 * Refuses (400, naming each field) text that PostgreSQL cannot store, anywhere in the path, the
 * query string or a JSON body: the NUL character (text columns cannot hold U+0000) and unpaired
 * UTF-16 surrogates (JSON.parse lets them through; jsonb refuses them, and UTF-8 cannot encode
 * them). Either would otherwise fail deep inside a query as a 500 — for instance in the audit
 * entry's jsonb. Multipart form fields are checked by parseBody (unstorableTextErrors), and
 * uploaded file names are cleaned where they are read.
 */
export const refuseUnstorableText: RequestHandler = (req, _res, next) => {
  const errors: FieldError[] = [];
  let pathText = req.path;
  try {
    pathText = decodeURIComponent(req.path);
  } catch {
    // A malformed escape is the router's concern (it answers 400 itself).
  }
  const pathProblem = problemOf(pathText);
  if (pathProblem) errors.push({ field: 'path', message: `the address ${pathProblem}` });
  walk(req.query, '', errors);
  if (req.body !== undefined && typeof req.body === 'object') walk(req.body, '', errors);
  if (!errors.length) return next();
  next(AppError.badRequest(`Text that cannot be stored: check ${errors.map((e) => e.field).join(', ')}.`, errors));
};
