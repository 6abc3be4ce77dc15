/**
 * The islands' one way to call Oxbloom's JSON API: sends JSON, and turns a refusal (our routes
 * answer `{error, field?}`) or a lost connection into a message to show.
 */

export type ApiAnswer<T> = { ok: true; status: number; body: T } | ApiFailure;

/** A refused or failed call; `status` 0 when Oxbloom could not be reached at all. */
export interface ApiFailure {
  ok: false;
  status: number;
  message: string;
  /** The input field the API named as at fault, e.g. `temperatureC` or `layers.1`. */
  field?: string;
}

export const NO_CONNECTION = 'No connection to Oxbloom. Check the network and try again.';

interface Call {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** Sent as JSON. */
  body?: unknown;
  headers?: Record<string, string>;
}

export async function callApi<T>(path: string, { method = 'GET', body, headers = {} }: Call = {}): Promise<ApiAnswer<T>> {
  let response: Response;
  try {
    response = await fetch(path, {
      method,
      headers: body === undefined ? headers : { 'content-type': 'application/json', ...headers },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    return { ok: false, status: 0, message: NO_CONNECTION };
  }
  if (response.status === 204) return { ok: true, status: 204, body: undefined as T };
  const answer: unknown = await response.json().catch(() => undefined);
  if (response.ok && answer !== undefined) return { ok: true, status: response.status, body: answer as T };
  const { error, field } = (answer ?? {}) as { error?: unknown; field?: unknown };
  return {
    ok: false,
    status: response.status,
    message: typeof error === 'string' ? error : fallbackMessage(response.status),
    field: typeof field === 'string' ? field : undefined,
  };
}

/** For an answer that is not our JSON (a proxy's page, a crash). */
const fallbackMessage = (status: number) =>
  status >= 400 && status < 500 ? `The request was refused (${status}).` : 'Oxbloom could not finish that just now. Try again in a moment.';
