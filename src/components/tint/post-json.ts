/** POSTs JSON to one of our API routes; a 4xx/5xx answer becomes its message and the field it names. */
export type ApiAnswer<T> = { ok: true; body: T } | { ok: false; message: string; field?: string };

export async function postJson<T>(path: string, body: unknown): Promise<ApiAnswer<T>> {
  let response: Response;
  try {
    response = await fetch(path, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  } catch {
    return { ok: false, message: 'Oxbloom could not be reached. Check your connection and try again.' };
  }
  const answer = await response.json().catch(() => null);
  if (response.ok && answer) return { ok: true, body: answer as T };
  return {
    ok: false,
    message: typeof answer?.error === 'string' ? answer.error : `Something went wrong (${response.status}). Try again.`,
    field: typeof answer?.field === 'string' ? answer.field : undefined,
  };
}
