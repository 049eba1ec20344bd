import type { FieldProblem } from '@shared/contract/words/fields.ts';

/**
 * A failed API call: the status, the stable `code` programs branch on, the message for people,
 * and for invalid input the refused fields by key (`fields`), so forms place each reason on its field.
 */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: readonly FieldProblem[] = [],
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

/** The `fields` of an error answer, keeping only well-formed entries (an older server sends none). */
function fieldsOf(value: unknown): FieldProblem[] {
  if (!Array.isArray(value)) return [];
  return value.filter(
    (p): p is FieldProblem => !!p && typeof p === 'object' && typeof p.field === 'string' && typeof p.reason === 'string' && typeof p.label === 'string',
  );
}

/**
 * Fetches JSON from Lagbook's API with the session cookie. Error answers
 * (`{ error: { code, message, fields? } }`) become ApiError; a network failure becomes an ApiError
 * with status 0, so every caller handles one error type.
 */
export async function apiFetch<T>(path: string, init: RequestInit = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      credentials: 'same-origin',
      ...init,
      headers: { Accept: 'application/json', ...(init.body ? { 'Content-Type': 'application/json' } : {}), ...init.headers },
    });
  } catch {
    throw new ApiError(0, 'network', 'Lagbook could not be reached. Check your connection.');
  }
  if (res.status === 204) return undefined as T;
  const body = await res.json().catch(() => null);
  if (!res.ok) {
    const err = (body as { error?: { code?: string; message?: string; fields?: unknown } } | null)?.error;
    throw new ApiError(res.status, err?.code ?? 'unknown', err?.message ?? `Request failed (${res.status}).`, fieldsOf(err?.fields));
  }
  return body as T;
}

/** True when an error means "not signed in" (the session ended or never began). */
export function isUnauthenticated(err: unknown): boolean {
  return err instanceof ApiError && err.status === 401;
}
