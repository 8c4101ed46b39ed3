// Wall-clock times in an event's time zone ⇄ instants, with the platform's Intl time-zone
// data (IANA tz database), so no time-zone library is shipped to the browser.

export function isTimeZone(tz: string): boolean {
  try {
    new Intl.DateTimeFormat("en-US", { timeZone: tz });
    return tz.length > 0 && tz.length <= 64;
  } catch {
    return false;
  }
}

/** The zone's offset from UTC at `instant`, in milliseconds. */
function offsetAt(instant: number, tz: string): number {
  const parts = new Intl.DateTimeFormat("en-US", {
    timeZone: tz,
    hourCycle: "h23",
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
    hour: "2-digit",
    minute: "2-digit",
    second: "2-digit",
  }).formatToParts(new Date(instant));
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value);
  const asUtc = Date.UTC(get("year"), get("month") - 1, get("day"), get("hour"), get("minute"), get("second"));
  return asUtc - Math.floor(instant / 1000) * 1000;
}

/**
 * "2026-06-20T06:00" in Europe/London → 2026-06-20T05:00:00Z. A wall time that falls in
 * a spring-forward gap resolves to the instant just after the gap; one in the repeated
 * autumn hour resolves to its first occurrence.
 */
export function zonedLocalToUtc(local: string, tz: string): Date {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(local);
  if (!m) throw new RangeError(`not a local date-time: ${local}`);
  const wall = Date.UTC(+m[1]!, +m[2]! - 1, +m[3]!, +m[4]!, +m[5]!);
  let guess = wall - offsetAt(wall, tz);
  guess = wall - offsetAt(guess, tz);
  return new Date(guess);
}

/** An instant as "YYYY-MM-DDTHH:mm" on the wall clock of `tz` (for datetime-local inputs). */
export function utcToZonedLocal(instant: Date, tz: string): string {
  const shifted = new Date(instant.getTime() + offsetAt(instant.getTime(), tz));
  return shifted.toISOString().slice(0, 16);
}

/** An event's wall-clock dates ("2026-06-20T06:00") as instants in its time zone. */
export function eventInstants(v: { startsLocal: string; endsLocal: string; timeZone: string }): {
  startsAt: Date;
  endsAt: Date;
} {
  return { startsAt: zonedLocalToUtc(v.startsLocal, v.timeZone), endsAt: zonedLocalToUtc(v.endsLocal, v.timeZone) };
}
