import type { QueueItem, SightingDetail } from "@/db/queries/review";
import type { ReviewState } from "@/lib/domain";

// The desk's calls to its handlers, and what they answer.
export type QueueResponse = { items: QueueItem[]; nextCursor: string | null; counts: Record<ReviewState, number> };
export type DetailResponse = Omit<SightingDetail, "check">;
export type Filters = Partial<Record<"state" | "zone" | "group" | "marks" | "volunteer" | "from" | "to" | "photo" | "order", string>>;

export class DeskError extends Error {
  constructor(message: string, readonly status: number) {
    super(message);
  }
}

/** The server's own words for a refusal: the first field's message, else the general one. */
export async function readError(res: Response, fallback: string): Promise<DeskError> {
  const body = (await res.json().catch(() => null)) as { error?: { message?: string; fields?: { message: string }[] } } | null;
  return new DeskError(body?.error?.fields?.[0]?.message ?? body?.error?.message ?? fallback, res.status);
}

export async function getJson<T>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: "application/json" } });
  if (!res.ok) throw await readError(res, res.statusText);
  return (await res.json()) as T;
}

export async function postJson<T>(url: string, body: unknown, fallback: string): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  } catch {
    throw new DeskError(fallback, 0);
  }
  if (!res.ok) throw await readError(res, fallback);
  return (await res.json()) as T;
}

export function filterParams(filters: Filters): URLSearchParams {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v) params.set(k, v);
  return params;
}
