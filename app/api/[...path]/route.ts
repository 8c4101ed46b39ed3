import { ApiError, handle } from "@/lib/http/errors";

// Any /api address that no other handler claims: a JSON 404, never an HTML page.
const notFound = handle(async () => {
  throw new ApiError("not_found");
});

export { notFound as GET, notFound as POST, notFound as PUT, notFound as PATCH, notFound as DELETE };
