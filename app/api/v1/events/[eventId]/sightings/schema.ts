import { z } from "zod";

export const sightingsQuery = z
  .object({
    format: z
      .enum(["json", "csv"])
      .default("json")
      .meta({ description: "json (default) or csv (RFC 4180, one header line of Darwin Core terms)." }),
    since: z.iso.datetime({ offset: true }).optional().meta({
      description:
        "Only sightings changed at or after this time (ISO 8601). For an incremental pull, pass the previous pull's modifiedUntil.",
    }),
    cursor: z
      .string()
      .regex(/^[A-Za-z0-9_-]{1,200}$/)
      .optional()
      .meta({ description: "Continue after the previous page (its nextCursor)." }),
    limit: z.coerce
      .number()
      .int()
      .min(1)
      .max(1000)
      .default(500)
      .meta({ description: "Sightings per page (1 to 1000, default 500)." }),
  })
  .strict();
export type SightingsQuery = z.infer<typeof sightingsQuery>;

const text = (description: string) => z.string().meta({ description });
const num = (description: string) => z.number().meta({ description });
// Each term as lib/results/exports.ts dwcRecord() writes it (the Darwin Core Archive's columns), plus dcterms:modified.
export const dwcOccurrence = z
  .object({
    occurrenceID: text("urn:uuid: of the sighting; stable, so a repeated pull replaces rather than duplicates."),
    basisOfRecord: z.literal("HumanObservation"),
    recordedBy: text("The name the recorder chose to publish, or an anonymous recorder id; never an e-mail address."),
    eventDate: text("When the sighting was made (ISO 8601, UTC)."),
    scientificName: z.string(),
    taxonRank: z.string(),
    vernacularName: text("Common name in the caller's language (Accept-Language), else English."),
    individualCount: z.number().int(),
    occurrenceStatus: z.literal("present"),
    decimalLatitude: num("WGS 84. For a generalised sensitive taxon, the centre of a 0.1-degree grid cell."),
    decimalLongitude: num("WGS 84. For a generalised sensitive taxon, the centre of a 0.1-degree grid cell."),
    geodeticDatum: z.literal("EPSG:4326"),
    coordinateUncertaintyInMeters: num(
      "The record's accuracy; for a generalised taxon widened to cover the grid cell.",
    ),
    identificationVerificationStatus: z.string(),
    dataGeneralizations: text("Says so when coordinates were generalised; empty otherwise."),
    datasetName: text("The event's name."),
    modified: text("dcterms:modified: when the sighting last changed (ISO 8601)."),
  })
  .strict()
  .meta({
    id: "DarwinCoreOccurrence",
    description: "One approved sighting as Darwin Core terms; restricted taxa are never listed.",
  });
export type DwcOccurrence = z.infer<typeof dwcOccurrence>;

export const sightingsPage = z.object({
  event: z.object({ id: z.uuid(), name: z.string() }),
  records: z.array(dwcOccurrence),
  withdrawn: z.array(z.string()).meta({
    description:
      "With since=, on the first page only (no cursor): occurrenceIDs of sightings approved once but no longer (rejected or returned since), to drop from an earlier pull.",
  }),
  withheld: z.number().int().meta({ description: "Sightings of restricted taxa on this page, left out." }),
  nextCursor: z.string().nullable().meta({ description: "Pass as cursor for the next page; null on the last page." }),
  modifiedUntil: z.iso
    .datetime()
    .nullable()
    .meta({ description: "Latest change among this page's sightings: the since of the next incremental pull." }),
});
export type SightingsPage = z.infer<typeof sightingsPage>;
