// The event pack (GET /api/events/{eventId}/pack): everything the field log needs to work
// offline at one event. Built by db/queries/pack.ts, kept on the phone (lib/field).
// Geometry is GeoJSON as RFC 7946 wants it: [longitude, latitude], WGS 84.

export type ArealGeometry =
  | { type: "Polygon"; coordinates: number[][][] }
  | { type: "MultiPolygon"; coordinates: number[][][][] };

export type ZoneFeature = {
  type: "Feature";
  id: string;
  geometry: ArealGeometry;
  properties: { name: string; habitat: string; description: string };
};
export type ZoneCollection = { type: "FeatureCollection"; features: ZoneFeature[] };

export type PackSpecies = {
  id: string;
  scientificName: string;
  rank: string;
  taxonGroup: string;
  sensitivity: "open" | "generalised" | "restricted";
  onList: boolean; // on the event's species list; others may still be recorded (and get a check mark)
  names: Record<string, string>; // common names in the event's languages, where known
};

export type EventPack = {
  event: {
    id: string; name: string; status: "draft" | "open" | "closed"; startsAt: string; endsAt: string; timeZone: string;
    languages: string[]; sessionKinds: string[]; accuracyLimitM: number;
    photoRules: { requiredForSensitive: boolean; requiredOffList: boolean };
    area: ArealGeometry | null;
  };
  zones: ZoneCollection;
  species: PackSpecies[];
};
