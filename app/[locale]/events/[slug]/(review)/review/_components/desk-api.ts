import type { BulkPreview, QueueItem, SightingDetail } from "@/db/queries/review";
import type { ReviewState } from "@/lib/domain";

// What the desk's handlers answer (called through lib/http/client.ts), and its filters as query parameters.
export type QueueResponse = { items: QueueItem[]; nextCursor: string | null; counts: Record<ReviewState, number> };
export type DetailResponse = Omit<SightingDetail, "check">;
export type BulkPreviewResponse = BulkPreview;
const FILTER_KEYS = ["state", "zone", "group", "marks", "volunteer", "from", "to", "photo", "order"] as const;
export type Filters = Partial<Record<(typeof FILTER_KEYS)[number], string>>;

/** The filters as the queue handler reads them (only those set). */
export function filterParams(filters: Filters): URLSearchParams {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v) params.set(k, v);
  return params;
}

// In the page's URL the desk's defaults are left out: no `state` means pending, `state=any`
// every state; no `order` means newest first. Unknown parameters are ignored.
export function filtersFromSearch(search: { get(name: string): string | null }): Filters {
  const f: Filters = {};
  for (const k of FILTER_KEYS) {
    const v = search.get(k);
    if (v) f[k] = v;
  }
  if (!f.state) f.state = "pending";
  else if (f.state === "any") delete f.state;
  if (!f.order) f.order = "newest";
  return f;
}

export function searchFromFilters(filters: Filters): URLSearchParams {
  const params = new URLSearchParams();
  for (const k of FILTER_KEYS) {
    const v = filters[k];
    if (k === "state") {
      if (!v) params.set("state", "any");
      else if (v !== "pending") params.set("state", v);
    } else if (k === "order") {
      if (v && v !== "newest") params.set("order", v);
    } else if (v) params.set(k, v);
  }
  return params;
}
