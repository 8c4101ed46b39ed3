import { describe, expect, it } from "vitest";
import { decodeCursor } from "@/db/queries/review";
import { queueFilters } from "@/lib/review/filters";

const cursor = (text: string) => Buffer.from(text, "utf8").toString("base64url");
const id = "0b6f1f8e-2a51-4c3b-9a7e-5d2c1b0a9f88";

describe("review queue filters", () => {
  it("accepts the desk's filters and splits the marks", () => {
    expect(
      queueFilters.parse({ state: "pending", marks: "outside_area,poor_accuracy", from: "2026-06-20", photo: "no" }),
    ).toEqual({
      state: "pending",
      marks: ["outside_area", "poor_accuracy"],
      from: "2026-06-20",
      photo: "no",
      order: "newest",
    });
  });

  it("refuses days that do not exist, unknown marks and unknown parameters, naming them", () => {
    for (const [input, field] of [
      [{ from: "2026-02-30" }, "from"],
      [{ to: "0000-01-01" }, "to"],
      [{ marks: "outside_area,nonsense" }, "marks"],
      [{ colour: "red" }, ""],
    ] as const) {
      const r = queueFilters.safeParse(input);
      expect(r.success, JSON.stringify(input)).toBe(false);
      if (!r.success && field) expect(r.error.issues[0]!.path[0]).toBe(field);
    }
  });
});

describe("queue cursors", () => {
  it("reads back what PostgreSQL prints for a timestamp, and nothing impossible", () => {
    expect(decodeCursor(cursor(`2026-06-21 07:10:00.123456+00|${id}`))).toEqual({
      observedAt: "2026-06-21 07:10:00.123456+00",
      id,
    });
    expect(decodeCursor(cursor(`2026-06-21 08:10:00+01:00|${id}`))).toEqual({
      observedAt: "2026-06-21 08:10:00+01:00",
      id,
    });
    expect(decodeCursor(cursor(`2026-06-21 20:10:00+14:00|${id}`))?.observedAt).toBe("2026-06-21 20:10:00+14:00");
    for (const bad of [
      `2026-02-30 07:10:00+00|${id}`,
      `2026-06-21 25:10:00+00|${id}`,
      `2026-06-21 07:10:00+00|------------------------------------`,
      // Offsets PostgreSQL cannot read (+99 answered 500 before).
      `2026-06-21 07:10:00+99|${id}`,
      `2026-06-21 07:10:00-16:00|${id}`,
      `2026-06-21 07:10:00+01:75|${id}`,
      "garbage",
      "",
    ]) {
      expect(decodeCursor(cursor(bad)), bad).toBeNull();
    }
  });
});
