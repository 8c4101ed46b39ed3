import { describe, expect, it } from "vitest";
import { formatDayAndTime, formatEventDateTime, regionalLocale, zoneRegion } from "./regional";

// Zone → country pairs as the IANA time zone database's zone1970.tab lists them (from memory);
// the written forms are CLDR's, through the Node.js Intl the app runs on.
describe("regional dates and times", () => {
  it("takes the region from the event's time zone and keeps the reader's language", () => {
    expect(zoneRegion("Europe/London")).toBe("GB");
    expect(regionalLocale("en", "Europe/London")).toBe("en-GB");
    expect(regionalLocale("es", "Europe/Madrid")).toBe("es-ES");
    expect(regionalLocale("fr", "America/Montreal")).toBe("fr-CA");
    expect(regionalLocale("en-US", "Europe/London")).toBe("en-GB");
  });

  it("keeps the locale for a zone it does not know", () => {
    expect(regionalLocale("en", "Etc/UTC")).toBe("en");
    expect(regionalLocale("fr", "Antarctica/Troll")).toBe("fr");
  });

  it("writes an English-language event in London as 21/06/2026 with 24-hour times", () => {
    // 14:15 UTC is 15:15 British Summer Time.
    const at = "2026-06-21T14:15:00Z";
    expect(formatEventDateTime(at, "en", "Europe/London")).toBe("21/06/2026, 15:15");
    expect(formatDayAndTime(at, "en", "Europe/London")).toBe("21 June 15:15");
    // The same moment for an event in New York: the American order and a 12-hour clock.
    expect(formatEventDateTime(at, "en", "America/New_York")).toMatch(/^6\/21\/26, 10:15\sAM$/);
  });
});
