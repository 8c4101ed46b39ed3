import { ApiError, handle } from "@/lib/http/errors";

// Public by design (in the sense of the route-table test): it only ever answers 405, so a
// token never writes, whoever calls.
export const readOnly = handle(async () => {
  throw new ApiError("method_not_allowed");
});
