import { describe, expect, it } from "vitest";
import { ifNoneMatchHits } from "./etag";

describe("ifNoneMatchHits", () => {
  it("matches the same tag, a weak form of it, one of a list, and *", () => {
    expect(ifNoneMatchHits('"abc"', '"abc"')).toBe(true);
    expect(ifNoneMatchHits('W/"abc"', '"abc"')).toBe(true);
    expect(ifNoneMatchHits('"x", "abc"', '"abc"')).toBe(true);
    expect(ifNoneMatchHits("*", '"abc"')).toBe(true);
  });
  it("does not match another tag, an unquoted one, or no header", () => {
    expect(ifNoneMatchHits('"abd"', '"abc"')).toBe(false);
    expect(ifNoneMatchHits("abc", '"abc"')).toBe(false);
    expect(ifNoneMatchHits(null, '"abc"')).toBe(false);
  });
});
