import { describe, expect, it } from "vitest";
import { z } from "zod";
import { decisionInput } from "@/app/api/events/[eventId]/review/sightings/[sightingId]/decisions/schema";
import { taxaQuery } from "@/app/api/events/[eventId]/review/taxa/schema";
import { sightingRecord } from "@/lib/sync/records";
import { errorStatus, zodApiError, zodFieldProblems } from "./errors";

const problems = (schema: z.ZodType, value: unknown, locale: "en" | "es" | "fr" = "en") => {
  const parsed = schema.safeParse(value);
  if (parsed.success) throw new Error("expected a refusal");
  return { error: zodApiError(parsed.error, locale), fields: zodFieldProblems(parsed.error, locale) };
};

describe("refused input names the field and says what was expected", () => {
  it("a NUL in a decision's message is a 422 naming the field", () => {
    const { error } = problems(decisionInput, { action: "approve", version: 1, message: "ok\u0000" });
    expect(errorStatus[error.code]).toBe(422);
    expect(error.fields).toEqual([
      {
        field: "message",
        message: "Contains a character that cannot be stored (NUL, U+0000). Remove it and send again.",
      },
    ]);
    const ret = problems(decisionInput, { action: "return", version: 1, message: "what is\u0000 this?" }, "es");
    expect(errorStatus[ret.error.code]).toBe(422);
    expect(ret.error.fields[0]).toMatchObject({
      field: "message",
      message: expect.stringMatching(/^Contiene un carácter/),
    });
  });

  it("a NUL in the taxa search or in a synced sighting's notes is refused naming the field", () => {
    const q = problems(taxaQuery, { q: "oak\u0000" }, "fr");
    expect(q.error.code).toBe("unprocessable");
    expect(q.error.fields[0]).toMatchObject({ field: "q", message: expect.stringMatching(/^Contient un caractère/) });
    const record = {
      id: crypto.randomUUID(),
      sessionId: null,
      taxonId: crypto.randomUUID(),
      description: "",
      count: 1,
      countIsEstimate: false,
      observedAt: "2026-06-20T10:00:00Z",
      latitude: 52,
      longitude: -1,
      accuracyM: 5,
      zoneId: null,
      notes: "by the gate\u0000",
    };
    expect(problems(sightingRecord, record).fields).toEqual([
      { field: "notes", message: expect.stringMatching(/NUL/) },
    ]);
    expect(problems(sightingRecord, { ...record, notes: "", description: "\u0000" }).fields[0]!.field).toBe(
      "description",
    );
  });

  it("wrong types say what was expected instead of 'required'", () => {
    const wrong = problems(decisionInput, { action: "approve", version: "3" });
    expect(wrong.error.code).toBe("bad_request");
    expect(wrong.fields).toEqual([{ field: "version", message: "Expected a number." }]);
    expect(problems(decisionInput, { action: "approve", version: 1.5 }).fields[0]!.message).toBe(
      "Expected a whole number.",
    );
    const record = {
      id: crypto.randomUUID(),
      sessionId: null,
      taxonId: null,
      description: "a bird",
      count: 1,
      countIsEstimate: "yes",
      observedAt: "2026-06-20T10:00:00Z",
      latitude: "52",
      longitude: -1,
      accuracyM: 5,
      zoneId: null,
    };
    const fields = problems(sightingRecord, record).fields;
    expect(fields).toContainEqual({ field: "countIsEstimate", message: "Expected true or false." });
    expect(fields).toContainEqual({ field: "latitude", message: "Expected a number." });
    expect(problems(taxaQuery, { q: ["a", "b"] }, "es").fields[0]).toEqual({
      field: "q",
      message: "Se esperaba texto.",
    });
  });

  it("a missing field is still 'required'", () => {
    expect(problems(decisionInput, { action: "approve" }).fields).toEqual([
      { field: "version", message: "This field is required." },
    ]);
  });
});
