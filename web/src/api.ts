/**
 * The dashboard's calls to the server's REST API (same origin, under /api). Errors carry the
 * server's own message (it names the field, the rule and the value), so a form can show it.
 */

/** An answer other than 2xx, with the server's message. */
export class ApiError extends Error {
  readonly status: number;

  constructor(status: number, message: string) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
  }
}

async function errorOf(response: Response): Promise<ApiError> {
  let message = `${response.status} ${response.statusText}`;
  try {
    const body = (await response.json()) as { error?: unknown; issues?: unknown };
    if (Array.isArray(body.issues) && body.issues.length > 0) message = body.issues.join('; ');
    else if (typeof body.error === 'string') message = body.error;
  } catch {
    // not JSON: keep the status line
  }
  return new ApiError(response.status, message);
}

/**
 * GET a JSON answer under /api.
 *
 * @param path - after /api, e.g. `/runs/r-1/state`
 * @returns the parsed body, or null on 404 (an unknown run, or a route this server does not
 *   have yet, which the caller shows in words)
 * @throws ApiError on any other non-2xx answer; TypeError when the server cannot be reached
 */
export async function getJson<T>(path: string): Promise<T | null> {
  const response = await fetch(`/api${path}`, { headers: { accept: 'application/json' } });
  if (response.status === 404) return null;
  if (!response.ok) throw await errorOf(response);
  return (await response.json()) as T;
}

/**
 * POST a JSON body under /api.
 *
 * @returns the parsed answer
 * @throws ApiError with the server's message on any non-2xx answer
 */
export async function postJson<T>(path: string, body: unknown): Promise<T> {
  const response = await fetch(`/api${path}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', accept: 'application/json' },
    body: JSON.stringify(body),
  });
  if (!response.ok) throw await errorOf(response);
  return (await response.json()) as T;
}
