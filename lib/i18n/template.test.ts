import { describe, expect, it } from "vitest";
import compile from "icu-minify/compile";
import en from "@/messages/en.json";
import { messageTemplate } from "./template";

describe("messageTemplate", () => {
  it("gives the same {name} template from the ICU text and from its precompiled form", () => {
    const text = en.Results.live.besideRow;
    expect(messageTemplate(text)).toBe(text);
    expect(messageTemplate(compile(text))).toBe(text);
    expect(messageTemplate(compile("No placeholder"))).toBe("No placeholder");
  });

  it("refuses a message it cannot fill by simple replacement", () => {
    expect(() => messageTemplate(compile("{count, plural, one {# record} other {# records}}"))).toThrow();
  });
});
