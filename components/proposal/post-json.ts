/** What a JSON route answered: ok with a body, or an error message with field messages. */
export type PostResult<T> = { ok: true; data: T } | { ok: false; status: number; message: string; fieldErrors: Record<string, string[]> };

/** POSTs JSON to one of our routes (same origin, with the session cookie) and unpacks the answer. */
export async function postJson<T>(url: string, body: unknown): Promise<PostResult<T>> {
  try {
    const res = await fetch(url, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(body) });
    const json = await res.json().catch(() => ({}));
    if (res.ok) return { ok: true, data: json as T };
    return { ok: false, status: res.status, message: json?.error?.message ?? 'Something went wrong.', fieldErrors: json?.error?.fieldErrors ?? {} };
  } catch {
    return { ok: false, status: 0, message: 'Could not reach the server; check your connection.', fieldErrors: {} };
  }
}
