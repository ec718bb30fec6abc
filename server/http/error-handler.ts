import type { ErrorRequestHandler, RequestHandler, Response } from 'express';
import { PROBLEM_CONTENT_TYPE, type FieldError, type Problem } from '../../shared/api/problem.ts';
import { AppError } from './app-error.ts';
import { databaseUnavailable, isDatabaseUnavailable } from './database-errors.ts';

const TITLES: Record<number, string> = {
  400: 'Bad request',
  401: 'Not signed in',
  403: 'Forbidden',
  404: 'Not found',
  409: 'Conflict',
  413: 'Too large',
  415: 'Unsupported media type',
  422: 'Unprocessable content',
  429: 'Too many requests',
  500: 'Internal server error',
  503: 'Service unavailable',
};

export function sendProblem(res: Response, status: number, code: string, detail: string, errors?: FieldError[]) {
  const body: Problem = {
    type: `https://binwright.invalid/problems/${code}`,
    title: TITLES[status] ?? 'Error',
    status,
    detail,
    code,
    ...(errors && errors.length ? { errors } : {}),
  };
  res.status(status).type(PROBLEM_CONTENT_TYPE).send(JSON.stringify(body));
}

export const notFoundHandler: RequestHandler = (req, res) => {
  sendProblem(res, 404, 'not-found', `No API route ${req.method} ${req.path}.`);
};

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  expose?: boolean;
  message?: string;
}

export const errorHandler: ErrorRequestHandler = (err: unknown, _req, res, next) => {
  if (res.headersSent) return next(err);
  if (isDatabaseUnavailable(err)) {
    // A clear 503 instead of a generic 500: the client may retry; the server itself keeps running.
    const e = databaseUnavailable();
    res.setHeader('Retry-After', '30');
    if (!(err instanceof AppError)) console.error('[binwright] database unavailable:', (err as Error)?.message ?? err);
    return sendProblem(res, e.status, e.code, e.detail);
  }
  if (err instanceof AppError) return sendProblem(res, err.status, err.code, err.detail, err.errors);
  const e = err as HttpishError;
  const status = e.status ?? e.statusCode;
  if (e.type === 'entity.parse.failed') return sendProblem(res, 400, 'invalid-json', 'The request body is not valid JSON.');
  if (e.type === 'entity.too.large') return sendProblem(res, 413, 'too-large', 'The request body is too large.');
  if (status && status >= 400 && status < 500 && e.expose) {
    return sendProblem(res, status, 'bad-request', e.message ?? 'Bad request.');
  }
  console.error('[binwright] unhandled error', err);
  sendProblem(res, 500, 'internal', 'Something went wrong on the server. The error was logged.');
};
