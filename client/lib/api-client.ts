import { z } from 'zod';
import { ApiErrorBodySchema, FieldIssueSchema, type FieldIssue } from '../../shared/api/errors.ts';
import { CSRF_COOKIE, CSRF_HEADER } from '../../shared/auth/schemas.ts';

const API_BASE = '/api';
const FieldIssuesSchema = z.array(FieldIssueSchema);

/** A failed request: `message` is a sentence for people, `code` is for the program. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fieldIssues: FieldIssue[] = [],
  ) {
    super(message);
  }
}

function readCookie(name: string): string | undefined {
  const prefix = `${name}=`;
  const pair = document.cookie.split('; ').find((c) => c.startsWith(prefix));
  return pair && decodeURIComponent(pair.slice(prefix.length));
}

// The server sets the CSRF cookie on any /api response; a write before any read (or after the
// cookie was cleared) fetches one first instead of failing with 403.
async function csrfToken(): Promise<string> {
  const existing = readCookie(CSRF_COOKIE);
  if (existing) return existing;
  await fetch(`${API_BASE}/health`, { credentials: 'same-origin' });
  return readCookie(CSRF_COOKIE) ?? '';
}

async function toApiError(response: Response): Promise<ApiError> {
  const body = ApiErrorBodySchema.safeParse(await response.json().catch(() => null));
  if (!body.success) {
    return new ApiError(
      response.status,
      'unexpected-response',
      `The server answered with status ${response.status}. Please try again in a moment.`,
    );
  }
  const issues = FieldIssuesSchema.safeParse(body.data.details);
  return new ApiError(response.status, body.data.code, body.data.error, issues.success ? issues.data : []);
}

async function request<T>(method: string, path: string, body?: unknown): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') headers[CSRF_HEADER] = await csrfToken();

  let response: Response;
  try {
    response = await fetch(`${API_BASE}${path}`, {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'network', 'Pacewright cannot be reached. Check your connection and try again.');
  }
  if (!response.ok) throw await toApiError(response);
  return (response.status === 204 ? undefined : await response.json()) as T;
}

export const api = {
  get: <T>(path: string) => request<T>('GET', path),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  delete: <T = void>(path: string) => request<T>('DELETE', path),
};

export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}
