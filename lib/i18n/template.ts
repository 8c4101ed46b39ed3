/**
 * A message as a "{name}" template for code that fills the placeholders itself (the live board,
 * on the client). Built with next-intl's precompiled messages, `t.raw()` gives the compiled
 * form (a string, or an array of text and `[name]` parts); elsewhere (tests, scripts) the ICU text.
 * Only plain placeholders are allowed: a plural or a date in such a message throws here.
 */
export function messageTemplate(raw: unknown): string {
  if (typeof raw === "string") return raw;
  if (!Array.isArray(raw)) throw new Error("not a message");
  return raw
    .map((part: unknown) => {
      if (typeof part === "string") return part;
      if (Array.isArray(part) && part.length === 1 && typeof part[0] === "string") return `{${part[0]}}`;
      throw new Error("only plain {name} placeholders can be filled outside next-intl");
    })
    .join("");
}
