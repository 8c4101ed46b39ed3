import { describe, expect, it } from "vitest";
import { isTimeZone, utcToZonedLocal, zonedLocalToUtc } from "./zoned";

describe("event wall-clock times", () => {
  it("reads a summer time in London as UTC+1 and a winter time as UTC", () => {
    // Offsets from the IANA time zone database (tzdata, as bundled with Node's ICU): London keeps UTC+1
    // from the last Sunday of March to the last Sunday of October; Santiago is UTC-4 in its June winter.
    expect(zonedLocalToUtc("2026-06-20T06:00", "Europe/London").toISOString()).toBe("2026-06-20T05:00:00.000Z");
    expect(zonedLocalToUtc("2026-12-01T08:00", "Europe/London").toISOString()).toBe("2026-12-01T08:00:00.000Z");
    expect(zonedLocalToUtc("2026-06-20T06:00", "America/Santiago").toISOString()).toBe("2026-06-20T10:00:00.000Z");
  });

  it("round-trips through the form's local value", () => {
    for (const tz of ["Europe/Madrid", "Pacific/Auckland", "UTC", "Asia/Kolkata"]) {
      expect(utcToZonedLocal(zonedLocalToUtc("2027-03-14T09:30", tz), tz)).toBe("2027-03-14T09:30");
    }
  });

  it("moves a time inside the spring-forward gap to just after it", () => {
    // 01:30 does not exist in London on 29 March 2026 (clocks go from 01:00 to 02:00; IANA time zone database).
    expect(zonedLocalToUtc("2026-03-29T01:30", "Europe/London").toISOString()).toBe("2026-03-29T01:30:00.000Z");
  });

  it("knows IANA zone names", () => {
    expect(isTimeZone("Europe/London")).toBe(true);
    expect(isTimeZone("Mars/Olympus_Mons")).toBe(false);
    expect(isTimeZone("")).toBe(false);
  });
});
