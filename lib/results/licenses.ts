// The licences an organiser may choose for an event's published data (issue 16), the three a
// records network commonly accepts; URIs of their legal codes (from memory). The Darwin Core
// archive writes the URI in dcterms:license (lib/results/dwc.ts). Safe for the browser.
export const DATA_LICENSE_KEYS = ["cc0-1.0", "cc-by-4.0", "cc-by-nc-4.0"] as const;
export type DataLicense = (typeof DATA_LICENSE_KEYS)[number];
export const DEFAULT_DATA_LICENSE: DataLicense = "cc-by-4.0";

export const DATA_LICENSES: Record<DataLicense, { uri: string; name: string }> = {
  "cc0-1.0": { uri: "http://creativecommons.org/publicdomain/zero/1.0/legalcode", name: "CC0 1.0" },
  "cc-by-4.0": { uri: "http://creativecommons.org/licenses/by/4.0/legalcode", name: "CC BY 4.0" },
  "cc-by-nc-4.0": { uri: "http://creativecommons.org/licenses/by-nc/4.0/legalcode", name: "CC BY-NC 4.0" },
};
