// Client side of the setup handlers: SWR's fetcher and a JSON sender that returns the
// handler's answer whatever its status (errors carry translated field messages).
export type ApiAnswer<T = Record<string, unknown>> = { ok: boolean; status: number; body: T & ApiErrorBody };
export type ApiErrorBody = { error?: { code: string; message: string; fields?: { field: string; message: string }[] } };

export class FetchError extends Error {
  constructor(readonly status: number, message: string) {
    super(message);
  }
}

export async function fetcher<T>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: "application/json" } });
  const body = await res.json().catch(() => null);
  if (!res.ok) throw new FetchError(res.status, body?.error?.message ?? res.statusText);
  return body as T;
}

export async function send<T = Record<string, unknown>>(url: string, method: "POST" | "PUT" | "PATCH" | "DELETE", data?: unknown): Promise<ApiAnswer<T>> {
  const res = await fetch(url, {
    method,
    headers: data === undefined ? {} : { "content-type": "application/json" },
    body: data === undefined ? undefined : JSON.stringify(data),
  });
  const body = (await res.json().catch(() => ({}))) as T & ApiErrorBody;
  return { ok: res.ok, status: res.status, body };
}
