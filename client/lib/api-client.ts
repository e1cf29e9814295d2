import { z } from 'zod';
import { ApiErrorBodySchema, FieldIssueSchema, type FieldIssue } from '../../shared/api/errors.ts';
import { CSRF_COOKIE, CSRF_HEADER } from '../../shared/auth/schemas.ts';

const API_BASE = '/api';
const FieldIssuesSchema = z.array(FieldIssueSchema);
const NETWORK_ERROR = 'Pacewright cannot be reached. Check your connection and try again.';

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

/** The ApiError for a failed answer with status `status` and parsed JSON `body` (anything, even null). */
function toApiError(status: number, body: unknown): ApiError {
  const parsed = ApiErrorBodySchema.safeParse(body);
  if (!parsed.success) {
    return new ApiError(
      status,
      'unexpected-response',
      `The server answered with status ${status}. Please try again in a moment.`,
    );
  }
  const issues = FieldIssuesSchema.safeParse(parsed.data.details);
  return new ApiError(status, parsed.data.code, parsed.data.error, issues.success ? issues.data : []);
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
    throw new ApiError(0, 'network', NETWORK_ERROR);
  }
  if (!response.ok) throw toApiError(response.status, await response.json().catch(() => null));
  return (response.status === 204 ? undefined : await response.json()) as T;
}

function parseJson(text: string): unknown {
  try {
    return text ? JSON.parse(text) : null;
  } catch {
    return null;
  }
}

type UploadOptions = {
  /** Called with the fraction (0–1) of the request body sent so far. */
  onProgress?: (fraction: number) => void;
  /** Statuses besides 2xx whose JSON body is an answer, not an error (e.g. 422 with per-file results). */
  answerStatuses?: number[];
};

/**
 * POSTs multipart form data with XMLHttpRequest, which (unlike fetch) reports upload progress.
 * Same CSRF header, credentials and errors as the other requests.
 */
async function upload<T>(path: string, form: FormData, { onProgress, answerStatuses = [] }: UploadOptions = {}): Promise<T> {
  const token = await csrfToken();
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `${API_BASE}${path}`);
    xhr.withCredentials = true;
    xhr.responseType = 'text';
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.setRequestHeader(CSRF_HEADER, token);
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress?.(event.loaded / event.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', NETWORK_ERROR));
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was stopped.'));
    xhr.onload = () => {
      const body = parseJson(xhr.responseText);
      const ok = (xhr.status >= 200 && xhr.status < 300) || answerStatuses.includes(xhr.status);
      if (ok) {
        onProgress?.(1);
        resolve(body as T);
      } else reject(toApiError(xhr.status, body));
    };
    xhr.send(form);
  });
}

export const api = {
  upload,
  get: <T>(path: string) => request<T>('GET', path),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  put: <T = void>(path: string, body: unknown) => request<T>('PUT', path, body),
  delete: <T = void>(path: string, body?: unknown) => request<T>('DELETE', path, body),
};

export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}
