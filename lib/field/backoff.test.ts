import { describe, expect, it } from "vitest";
import { BACKOFF_BASE_MS, BACKOFF_MAX_MS, backoffDelay } from "./backoff";

describe("outbox back-off", () => {
  it("waits longer after each failed try, within a jittered band", () => {
    expect(backoffDelay(1, () => 0)).toBe(BACKOFF_BASE_MS / 2);
    expect(backoffDelay(1, () => 1)).toBe(BACKOFF_BASE_MS);
    expect(backoffDelay(2, () => 1)).toBe(BACKOFF_BASE_MS * 2);
    expect(backoffDelay(4, () => 1)).toBe(BACKOFF_BASE_MS * 8);
    const mid = backoffDelay(3, () => 0.5);
    expect(mid).toBeGreaterThan(BACKOFF_BASE_MS * 2);
    expect(mid).toBeLessThan(BACKOFF_BASE_MS * 4);
  });

  it("never waits more than the ceiling, however many tries failed", () => {
    expect(backoffDelay(50, () => 1)).toBe(BACKOFF_MAX_MS);
    expect(backoffDelay(1000, () => 0)).toBe(BACKOFF_MAX_MS / 2);
  });
});
