import type { Problem } from '../../shared/api/problem.ts';

/** Any non-2xx answer of the API, carrying its RFC 9457 problem. */
export class ApiError extends Error {
  readonly status: number;
  readonly problem: Problem;
  constructor(problem: Problem) {
    super(problem.detail);
    this.name = 'ApiError';
    this.status = problem.status;
    this.problem = problem;
  }
  /** The message for one field, when the server named it. */
  fieldError(field: string): string | undefined {
    return this.problem.errors?.find((e) => e.field === field)?.message;
  }
}

let csrfToken: string | null = null;

async function fetchCsrf(): Promise<string> {
  const res = await fetch('/api/auth/csrf', { credentials: 'same-origin' });
  const body = (await res.json()) as { csrfToken: string };
  csrfToken = body.csrfToken;
  return csrfToken;
}

export function resetCsrf() {
  csrfToken = null;
}

async function toApiError(res: Response): Promise<ApiError> {
  let problem: Problem;
  try {
    problem = (await res.json()) as Problem;
  } catch {
    problem = { type: 'about:blank', title: res.statusText, status: res.status, detail: `The server answered ${res.status} ${res.statusText}.` };
  }
  return new ApiError(problem);
}

type Body = Record<string, unknown> | unknown[] | FormData | undefined;

/**
 * The one way the client talks to the API: JSON in and out, same-origin cookie, the CSRF
 * token on every state-changing request (fetched once, refreshed once on a 403 csrf answer).
 */
export async function api<T>(method: string, url: string, body?: Body, retried = false): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  const unsafe = method !== 'GET' && method !== 'HEAD';
  if (unsafe) headers['x-csrf-token'] = csrfToken ?? (await fetchCsrf());
  let payload: BodyInit | undefined;
  if (body instanceof FormData) payload = body;
  else if (body !== undefined) {
    headers['Content-Type'] = 'application/json';
    payload = JSON.stringify(body);
  }
  const res = await fetch(url, { method, headers, body: payload, credentials: 'same-origin' });
  if (!res.ok) {
    const err = await toApiError(res);
    if (unsafe && !retried && res.status === 403 && err.problem.code === 'csrf') {
      csrfToken = null;
      return api<T>(method, url, body, true);
    }
    throw err;
  }
  if (res.status === 204) return undefined as T;
  const type = res.headers.get('content-type') ?? '';
  return (type.includes('json') ? await res.json() : await res.text()) as T;
}

export const apiClient = {
  get: <T>(url: string) => api<T>('GET', url),
  post: <T>(url: string, body?: Body) => api<T>('POST', url, body),
  patch: <T>(url: string, body?: Body) => api<T>('PATCH', url, body),
  put: <T>(url: string, body?: Body) => api<T>('PUT', url, body),
  delete: <T>(url: string) => api<T>('DELETE', url),
};

/** Builds a query string, leaving out empty values. */
export function qs(params: Record<string, string | number | boolean | undefined | null>): string {
  const u = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== '') u.set(k, String(v));
  const s = u.toString();
  return s ? `?${s}` : '';
}
