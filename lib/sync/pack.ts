// The event pack (GET /api/events/{eventId}/pack): everything the field log needs to work
// offline at one event. Built by db/queries/pack.ts, kept on the phone (lib/field).
// Geometry is GeoJSON as RFC 7946 wants it: [longitude, latitude], WGS 84.
import type { EventStatus, Habitat, Sensitivity, TaxonGroup, TaxonRank } from "@/lib/domain";
import type { ArealGeometry, ZoneFeature as ArealZoneFeature } from "@/lib/geo/areal";
import type { CountUnit } from "@/lib/results/settings";

export type { ArealGeometry } from "@/lib/geo/areal";
/** A zone as the pack carries it: the shared areal feature, always with its description. */
export type ZoneFeature = Omit<ArealZoneFeature, "properties"> & {
  properties: { name: string; habitat: Habitat; description: string };
};
export type ZoneCollection = { type: "FeatureCollection"; features: ZoneFeature[] };

export type PackSpecies = {
  id: string;
  scientificName: string;
  rank: TaxonRank;
  taxonGroup: TaxonGroup;
  sensitivity: Sensitivity;
  onList: boolean; // on the event's species list; others may still be recorded (and get a check mark)
  names: Record<string, string>; // common names in the event's languages, where known
};

export type EventPack = {
  event: {
    id: string;
    name: string;
    status: EventStatus;
    startsAt: string;
    endsAt: string;
    timeZone: string;
    languages: string[];
    sessionKinds: string[];
    accuracyLimitM: number;
    photoRules: { requiredForSensitive: boolean; requiredOffList: boolean };
    area: ArealGeometry | null;
    /** What a count means for each taxon group in this event (lib/results/settings.ts), for the field log to show beside the count. */
    countUnits: Record<string, CountUnit>;
  };
  zones: ZoneCollection;
  species: PackSpecies[];
  /**
   * This event's most-recorded taxa (ids, most first: non-rejected sightings by everyone), for
   * the species search before any typing. Open taxa only. Packs stored before it was added lack it.
   */
  mostRecorded?: string[];
};
