import { z } from "zod";

// Pieces shared by the read-only API's handlers (app/api/v1) and its OpenAPI description
// (app/api/openapi.json): the handlers parse with these, the document is generated from them.

export const eventIdParams = z
  .object({
    eventId: z.uuid().meta({ description: "The event's id (GET /api/v1/events lists those the token may read)." }),
  })
  .strict();

export const errorBody = z
  .object({
    error: z.object({
      code: z.string().meta({
        description:
          "A stable code: bad_request, api_token_refused, forbidden, not_found, method_not_allowed, rate_limited, internal.",
      }),
      message: z
        .string()
        .meta({ description: "What went wrong, in the caller's language (Accept-Language: en, es, fr)." }),
      fields: z.array(z.object({ field: z.string(), message: z.string() })),
    }),
  })
  .meta({ id: "Error" });

/** Every v1 handler answers only GET; a token never writes. */
export const READ_ONLY_NOTE = "Tokens are read-only: any method other than GET is answered 405.";
