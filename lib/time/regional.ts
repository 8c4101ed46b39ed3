// Dates and times that follow the reader's language and the event's region: an English-language
// event in Europe/London reads 21/06/2026 and 24-hour times (en-GB), not the American defaults
// of a bare "en". The region comes from the event's IANA time zone.

// The country of common IANA zones (from memory of the IANA time zone database's zone1970.tab).
// A zone missing here keeps the reader's own locale unchanged.
const ZONE_REGION: Record<string, string> = {
  "Europe/London": "GB",
  "Europe/Dublin": "IE",
  "Europe/Lisbon": "PT",
  "Europe/Madrid": "ES",
  "Atlantic/Canary": "ES",
  "Europe/Paris": "FR",
  "Europe/Brussels": "BE",
  "Europe/Amsterdam": "NL",
  "Europe/Luxembourg": "LU",
  "Europe/Berlin": "DE",
  "Europe/Zurich": "CH",
  "Europe/Vienna": "AT",
  "Europe/Rome": "IT",
  "Europe/Copenhagen": "DK",
  "Europe/Oslo": "NO",
  "Europe/Stockholm": "SE",
  "Europe/Helsinki": "FI",
  "Europe/Warsaw": "PL",
  "Europe/Prague": "CZ",
  "Europe/Athens": "GR",
  "Africa/Casablanca": "MA",
  "Africa/Algiers": "DZ",
  "Africa/Tunis": "TN",
  "Africa/Cairo": "EG",
  "Asia/Riyadh": "SA",
  "Asia/Dubai": "AE",
  "America/New_York": "US",
  "America/Chicago": "US",
  "America/Denver": "US",
  "America/Los_Angeles": "US",
  "America/Anchorage": "US",
  "Pacific/Honolulu": "US",
  "America/Toronto": "CA",
  "America/Vancouver": "CA",
  "America/Montreal": "CA",
  "America/Mexico_City": "MX",
  "America/Bogota": "CO",
  "America/Lima": "PE",
  "America/Santiago": "CL",
  "America/Argentina/Buenos_Aires": "AR",
  "America/Sao_Paulo": "BR",
  "Australia/Sydney": "AU",
  "Australia/Melbourne": "AU",
  "Australia/Brisbane": "AU",
  "Australia/Perth": "AU",
  "Pacific/Auckland": "NZ",
  "Asia/Kolkata": "IN",
  "Asia/Tokyo": "JP",
  "Africa/Johannesburg": "ZA",
  "Africa/Nairobi": "KE",
};

/** The region (ISO 3166 alpha-2) of an IANA time zone, when we know it. */
export function zoneRegion(timeZone: string): string | null {
  return ZONE_REGION[timeZone] ?? null;
}

/**
 * The reader's language with the event's region: ("en", "Europe/London") → "en-GB",
 * ("fr", "America/Montreal") → "fr-CA". An unknown zone, or a locale Intl refuses, keeps the locale.
 */
export function regionalLocale(locale: string, timeZone: string): string {
  const region = zoneRegion(timeZone);
  if (!region) return locale;
  try {
    return new Intl.Locale(locale, { region }).toString();
  } catch {
    return locale;
  }
}

/** A date and time in the event's zone, written as the reader's language writes it in the event's region. */
export function formatEventDateTime(
  value: Date | string,
  locale: string,
  timeZone: string,
  options: Intl.DateTimeFormatOptions = { dateStyle: "short", timeStyle: "short" },
): string {
  return new Intl.DateTimeFormat(regionalLocale(locale, timeZone), { ...options, timeZone }).format(new Date(value));
}

/** "21 June 15:15": the day and month in words and the time, as the toast names a record. */
export function formatDayAndTime(value: Date | string, locale: string, timeZone: string): string {
  const loc = regionalLocale(locale, timeZone);
  const at = new Date(value);
  const day = new Intl.DateTimeFormat(loc, { day: "numeric", month: "long", timeZone }).format(at);
  const time = new Intl.DateTimeFormat(loc, { timeStyle: "short", timeZone }).format(at);
  return `${day} ${time}`;
}
