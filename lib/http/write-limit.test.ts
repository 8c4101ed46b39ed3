import { describe, expect, it } from "vitest";
import { ApiError } from "@/lib/http/errors";
import { limitWrites, takeToken } from "@/lib/http/write-limit";

describe("write rate limit", () => {
  it("allows `limit` calls per window, then refuses until the window has moved on", () => {
    const key = `k-${Math.random()}`;
    const t0 = 1_000_000;
    for (let i = 0; i < 3; i++) expect(takeToken(key, 3, 1000, t0 + i)).toBe(true);
    expect(takeToken(key, 3, 1000, t0 + 10)).toBe(false);
    expect(takeToken(key, 3, 1000, t0 + 1001)).toBe(true);
  });

  it("answers with the rate_limited error that maps to 429", () => {
    const key = `k-${Math.random()}`;
    limitWrites(key, 1, 60_000);
    expect(() => limitWrites(key, 1, 60_000)).toThrow(ApiError);
    try {
      limitWrites(key, 1, 60_000);
    } catch (e) {
      expect((e as ApiError).code).toBe("rate_limited");
    }
  });
});
