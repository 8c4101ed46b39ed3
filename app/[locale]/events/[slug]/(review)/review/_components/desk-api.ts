import type { QueueItem, SightingDetail } from "@/db/queries/review";
import type { ReviewState } from "@/lib/domain";

// What the desk's handlers answer (called through lib/http/client.ts), and its filters as query parameters.
export type QueueResponse = { items: QueueItem[]; nextCursor: string | null; counts: Record<ReviewState, number> };
export type DetailResponse = Omit<SightingDetail, "check">;
export type Filters = Partial<
  Record<"state" | "zone" | "group" | "marks" | "volunteer" | "from" | "to" | "photo" | "order", string>
>;

export function filterParams(filters: Filters): URLSearchParams {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v) params.set(k, v);
  return params;
}
