import type { ApiErrorBody, ErrorCode, FieldProblem } from "./errors";

// The one browser-side client of our route handlers (pages, the field log, its service
// worker). Every error answer of ours has the body errorResponse writes (ApiErrorBody);
// a refusal becomes one ApiClientError whatever the handler. Not for other servers (the
// photo store's presigned URLs are plain fetches).

/**
 * A call that did not succeed. `code` is the server's error code, or "network" when no
 * answer came (offline, a timeout, an abort: status 0), or "unreadable" when an answer came
 * whose body could not be read as JSON (cut off mid-way, or not one of ours: a proxy's page).
 */
export class ApiClientError<E = object> extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode | "network" | "unreadable",
    message: string,
    readonly fields: FieldProblem[] = [],
    /** The whole error body, with what a handler adds to it (e.g. an upload's report). */
    readonly body: (ApiErrorBody & E) | null = null,
  ) {
    super(message);
    this.name = "ApiClientError";
  }

  /** What to show a person: the first field's problem, else the general message (empty without an answer). */
  get problem(): string {
    return this.fields[0]?.message ?? this.message;
  }
}

export type ApiResult<T, E = object> = { ok: true; status: number; data: T } | { ok: false; error: ApiClientError<E> };

export type CallOptions = {
  method?: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  body?: unknown; // sent as JSON
  headers?: Record<string, string>;
  signal?: AbortSignal;
  cache?: RequestCache;
};

async function fetchAnswer<E>(url: string, options: CallOptions): Promise<Response | ApiClientError<E>> {
  const { method = "GET", body, headers = {}, signal, cache } = options;
  try {
    return await fetch(url, {
      method,
      signal,
      cache,
      credentials: "same-origin",
      headers: {
        accept: "application/json",
        ...(body === undefined ? {} : { "content-type": "application/json" }),
        ...headers,
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    return new ApiClientError<E>(0, "network", "");
  }
}

async function readAnswer<T, E>(res: Response): Promise<ApiResult<T, E>> {
  let json: unknown;
  try {
    json = await res.json();
  } catch {
    return { ok: false, error: new ApiClientError<E>(res.status, "unreadable", "") };
  }
  if (res.ok) return { ok: true, status: res.status, data: json as T };
  const answer = json as ApiErrorBody & E;
  return {
    ok: false,
    error: new ApiClientError<E>(res.status, answer.error.code, answer.error.message, answer.error.fields, answer),
  };
}

/** One call, never throwing: the answer's data, or the ApiClientError. `E` names what the handler adds to its error body. */
async function call<T, E = object>(url: string, options: CallOptions = {}): Promise<ApiResult<T, E>> {
  const res = await fetchAnswer<E>(url, options);
  return res instanceof ApiClientError ? { ok: false, error: res } : readAnswer<T, E>(res);
}

async function orThrow<T>(result: Promise<ApiResult<T>>): Promise<T> {
  const r = await result;
  if (!r.ok) throw r.error;
  return r.data;
}

type PlainOptions = Pick<CallOptions, "signal" | "cache">;

export const api = {
  call,
  /** GET a handler's JSON answer; throws ApiClientError. */
  get: <T>(url: string, options: PlainOptions = {}) => orThrow(call<T>(url, options)),
  /** Send `body` (if any) as JSON and read the answer; throws ApiClientError. */
  send: <T = { ok: true }>(
    url: string,
    method: "POST" | "PUT" | "PATCH" | "DELETE",
    body?: unknown,
    options: PlainOptions = {},
  ) => orThrow(call<T>(url, { ...options, method, body })),
  /** A conditional GET (ETag): unchanged (304) when `etag` still matches, else the new answer and its tag; throws ApiClientError. */
  async getIfChanged<T>(
    url: string,
    etag: string | null,
    options: PlainOptions = {},
  ): Promise<{ changed: false } | { changed: true; data: T; etag: string | null }> {
    const res = await fetchAnswer(url, { ...options, headers: etag ? { "if-none-match": etag } : {} });
    if (res instanceof ApiClientError) throw res;
    if (res.status === 304) return { changed: false };
    return { changed: true, data: await orThrow(readAnswer<T, object>(res)), etag: res.headers.get("etag") };
  },
};

/** SWR's fetcher: the answer of a GET, or an ApiClientError as SWR's `error`. */
export const fetcher = <T>(url: string): Promise<T> => api.get<T>(url);
