import { sql } from "drizzle-orm";
import {
  type AnyPgColumn,
  bigint,
  bigserial,
  boolean,
  check,
  customType,
  foreignKey,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  real,
  smallint,
  text,
  timestamp,
  uniqueIndex,
  uuid,
  varchar,
} from "drizzle-orm/pg-core";
import {
  ADMIN_ACTIONS,
  CHECK_MARKS,
  EVENT_ROLES,
  EVENT_STATUSES,
  HABITATS,
  MAIL_STATUSES,
  MEMBERSHIP_ACTIONS,
  ORG_ROLES,
  ORGANISATION_LOG_ACTIONS,
  ORGANISATION_REQUEST_STATES,
  REVIEW_STATES,
  SENSITIVITIES,
  SESSION_KINDS,
  SIGHTING_SOURCES,
  TAXON_GROUPS,
  TAXON_RANKS,
} from "../lib/domain";
import { pointFromWkbHex, type LonLat } from "../lib/geo/ewkb";

// PostGIS columns. Areas and zones are written with ST_GeomFromGeoJSON and read back with
// ST_AsGeoJSON in the queries, so their driver value is kept raw; they may be a Polygon or
// a MultiPolygon (an event area in two parts, a zone split by a river), and a CHECK on
// each column keeps any other geometry out. A point is a longitude and a latitude: written
// as ST_MakePoint in WGS 84, read from the (E)WKB that PostgreSQL returns.
const areal = customType<{ data: string; driverData: string }>({
  dataType: () => "geometry(Geometry,4326)",
});
const point = customType<{ data: LonLat; driverData: string }>({
  dataType: () => "geometry(Point,4326)",
  toDriver: ({ longitude, latitude }) => sql`ST_SetSRID(ST_MakePoint(${longitude}, ${latitude}), 4326)`,
  fromDriver: (value) => pointFromWkbHex(value),
});

const createdAt = () => timestamp("created_at", { withTimezone: true }).notNull().defaultNow();

// ---------------------------------------------------------------- enums (design.md "Words"; the lists live in lib/domain.ts)
export const reviewState = pgEnum("review_state", REVIEW_STATES);
export const eventRole = pgEnum("event_role", EVENT_ROLES);
export const orgRole = pgEnum("org_role", ORG_ROLES);
export const habitatKind = pgEnum("habitat_kind", HABITATS);
export const taxonGroup = pgEnum("taxon_group", TAXON_GROUPS);
export const taxonRank = pgEnum("taxon_rank", TAXON_RANKS);
export const sensitivity = pgEnum("sensitivity", SENSITIVITIES);
export const sessionKind = pgEnum("session_kind", SESSION_KINDS);
export const eventStatus = pgEnum("event_status", EVENT_STATUSES);
export const checkMark = pgEnum("check_mark", CHECK_MARKS);
export const outboxStatus = pgEnum("outbox_status", MAIL_STATUSES);
export const sightingSource = pgEnum("sighting_source", SIGHTING_SOURCES);

// ---------------------------------------------------------------- sign-in (next-auth's shape)
export const users = pgTable(
  "users",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    name: text("name"),
    email: text("email").notNull(),
    emailVerified: timestamp("email_verified", { withTimezone: true, mode: "date" }),
    image: text("image"),
    passwordHash: text("password_hash"),
    locale: varchar("locale", { length: 8 }).notNull().default("en"),
    isAdmin: boolean("is_admin").notNull().default(false),
    // Raised by sign-out, a password change or erasure: every session token carries the value it
    // was issued with, and one that no longer matches is refused (server/auth/options.ts).
    sessionVersion: integer("session_version").notNull().default(0),
    // What is published about the person (Darwin Core's recordedBy), never their e-mail, and
    // when they agreed to it. An erased person keeps only an anonymous recorder name here.
    publishedName: text("published_name"),
    publishConsentAt: timestamp("publish_consent_at", { withTimezone: true, mode: "date" }),
    // Set when the person erased their account: the row stays as a tombstone without personal data.
    erasedAt: timestamp("erased_at", { withTimezone: true, mode: "date" }),
    // Set by a site admin: a locked account cannot sign in (server/auth/options.ts), and its sessions end.
    lockedAt: timestamp("locked_at", { withTimezone: true, mode: "date" }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("users_email_lower_key").on(sql`lower(${t.email})`),
    check("users_email_shape", sql`${t.email} ~ '^[^@\\s]+@[^@\\s]+$'`),
  ],
);

export const accounts = pgTable(
  "accounts",
  {
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    type: text("type").notNull(),
    provider: text("provider").notNull(),
    providerAccountId: text("provider_account_id").notNull(),
    refresh_token: text("refresh_token"),
    access_token: text("access_token"),
    expires_at: integer("expires_at"),
    token_type: text("token_type"),
    scope: text("scope"),
    id_token: text("id_token"),
    session_state: text("session_state"),
  },
  (t) => [primaryKey({ columns: [t.provider, t.providerAccountId] }), index("accounts_user_idx").on(t.userId)],
);

export const sessions = pgTable(
  "sessions",
  {
    sessionToken: text("session_token").primaryKey(),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    expires: timestamp("expires", { withTimezone: true, mode: "date" }).notNull(),
  },
  (t) => [index("sessions_user_idx").on(t.userId)],
);

export const verificationTokens = pgTable(
  "verification_tokens",
  {
    identifier: text("identifier").notNull(),
    token: text("token").notNull(),
    expires: timestamp("expires", { withTimezone: true, mode: "date" }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.identifier, t.token] })],
);

// ---------------------------------------------------------------- organisations and events
export const organisations = pgTable(
  "organisations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    slug: varchar("slug", { length: 80 }).notNull().unique(),
    name: text("name").notNull(),
    contactEmail: text("contact_email").notNull().default(""),
    country: varchar("country", { length: 2 }), // ISO 3166-1 alpha-2
    description: text("description").notNull().default(""),
    // Set by a site admin: a suspended organisation's organisers cannot create events.
    suspendedAt: timestamp("suspended_at", { withTimezone: true, mode: "date" }),
    createdAt: createdAt(),
  },
  (t) => [check("organisations_slug_shape", sql`${t.slug} ~ '^[a-z0-9]+(-[a-z0-9]+)*$'`)],
);

export const organisationMembers = pgTable(
  "organisation_members",
  {
    organisationId: uuid("organisation_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "cascade" }),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: orgRole("role").notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.organisationId, t.userId] }), index("organisation_members_user_idx").on(t.userId)],
);

export const events = pgTable(
  "events",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: uuid("organisation_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "restrict" }),
    slug: varchar("slug", { length: 80 }).notNull().unique(),
    name: text("name").notNull(),
    description: text("description").notNull().default(""),
    status: eventStatus("status").notNull().default("draft"),
    startsAt: timestamp("starts_at", { withTimezone: true, mode: "date" }).notNull(),
    endsAt: timestamp("ends_at", { withTimezone: true, mode: "date" }).notNull(),
    timeZone: text("time_zone").notNull(),
    languages: text("languages")
      .array()
      .notNull()
      .default(sql`ARRAY['en']::text[]`),
    area: areal("area"),
    sessionKinds: sessionKind("session_kinds")
      .array()
      .notNull()
      .default(sql`ARRAY['timed_count','walk','plot_search']::session_kind[]`),
    photoRequiredSensitive: boolean("photo_required_sensitive").notNull().default(true),
    photoRequiredOffList: boolean("photo_required_off_list").notNull().default(true),
    // Restricted taxa in public outputs: "event" (listed with their event total only) or "hidden" (issue 13).
    publicRestricted: text("public_restricted").notNull().default("event"),
    // The licence of the event's published data (lib/results/dwc.ts DATA_LICENSES), and whether its
    // Darwin Core archive states absences of listed species in complete count sessions (issue 16).
    dataLicense: text("data_license").notNull().default("cc-by-4.0"),
    publishAbsences: boolean("publish_absences").notNull().default(false),
    // An invented event (the demo's): its archives say so in their title and abstract.
    isDemo: boolean("is_demo").notNull().default(false),
    accuracyLimitM: integer("accuracy_limit_m").notNull().default(100),
    joinCode: varchar("join_code", { length: 32 }).unique(),
    // The review period ends here (design.md "review period"); null: 30 days after the end
    // (lib/time/review-period.ts). Answers and corrections are taken until then.
    reviewClosesAt: timestamp("review_closes_at", { withTimezone: true, mode: "date" }),
    createdAt: createdAt(),
  },
  (t) => [
    check("events_ends_after_starts", sql`${t.endsAt} > ${t.startsAt}`),
    check("events_review_after_end", sql`${t.reviewClosesAt} IS NULL OR ${t.reviewClosesAt} >= ${t.endsAt}`),
    check("events_slug_shape", sql`${t.slug} ~ '^[a-z0-9]+(-[a-z0-9]+)*$'`),
    check("events_accuracy_limit_positive", sql`${t.accuracyLimitM} > 0`),
    check("events_public_restricted_kind", sql`${t.publicRestricted} IN ('event', 'hidden')`),
    check("events_data_license_kind", sql`${t.dataLicense} IN ('cc0-1.0', 'cc-by-4.0', 'cc-by-nc-4.0')`),
    check("events_languages_nonempty", sql`cardinality(${t.languages}) > 0`),
    check("events_area_valid", sql`${t.area} IS NULL OR ST_IsValid(${t.area})`),
    check("events_area_areal", sql`${t.area} IS NULL OR GeometryType(${t.area}) IN ('POLYGON', 'MULTIPOLYGON')`),
    index("events_organisation_idx").on(t.organisationId),
    index("events_area_gist").using("gist", t.area),
  ],
);

export const zones = pgTable(
  "zones",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    eventId: uuid("event_id")
      .notNull()
      .references(() => events.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    habitat: habitatKind("habitat").notNull(),
    description: text("description").notNull().default(""),
    geom: areal("geom").notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("zones_event_name_key").on(t.eventId, t.name),
    check("zones_geom_valid", sql`ST_IsValid(${t.geom})`),
    check("zones_geom_areal", sql`GeometryType(${t.geom}) IN ('POLYGON', 'MULTIPOLYGON')`),
    index("zones_geom_gist").using("gist", t.geom),
  ],
);

// ---------------------------------------------------------------- taxa and species lists
export const taxa = pgTable(
  "taxa",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    scientificName: text("scientific_name").notNull(),
    rank: taxonRank("rank").notNull().default("species"),
    taxonGroup: taxonGroup("taxon_group").notNull(),
    sensitivity: sensitivity("sensitivity").notNull().default("open"),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("taxa_scientific_name_key").on(sql`lower(${t.scientificName})`),
    check("taxa_scientific_name_nonempty", sql`length(btrim(${t.scientificName})) > 0`),
  ],
);

export const taxonNames = pgTable(
  "taxon_names",
  {
    taxonId: uuid("taxon_id")
      .notNull()
      .references(() => taxa.id, { onDelete: "cascade" }),
    locale: varchar("locale", { length: 8 }).notNull(),
    name: text("name").notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.taxonId, t.locale] }),
    check("taxon_names_nonempty", sql`length(btrim(${t.name})) > 0`),
  ],
);

export const eventSpecies = pgTable(
  "event_species",
  {
    eventId: uuid("event_id")
      .notNull()
      .references(() => events.id, { onDelete: "cascade" }),
    taxonId: uuid("taxon_id")
      .notNull()
      .references(() => taxa.id, { onDelete: "restrict" }),
    addedAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.eventId, t.taxonId] })],
);

// What a count means for one taxon group in one event (lib/results/settings.ts holds the
// defaults for groups without a row): abundance estimators need counts of individuals.
export const countUnit = pgEnum("count_unit", ["individuals", "stems", "clumps", "colonies", "presence"]);
export const eventCountUnits = pgTable(
  "event_count_units",
  {
    eventId: uuid("event_id")
      .notNull()
      .references(() => events.id, { onDelete: "cascade" }),
    taxonGroup: taxonGroup("taxon_group").notNull(),
    unit: countUnit("unit").notNull(),
  },
  (t) => [primaryKey({ columns: [t.eventId, t.taxonGroup] })],
);

// ---------------------------------------------------------------- people in events
export const eventMembers = pgTable(
  "event_members",
  {
    eventId: uuid("event_id")
      .notNull()
      .references(() => events.id, { onDelete: "cascade" }),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: eventRole("role").notNull(),
    // Empty means every group; a coordinator limited to birds holds {birds}.
    taxonGroups: taxonGroup("taxon_groups")
      .array()
      .notNull()
      .default(sql`ARRAY[]::taxon_group[]`),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.eventId, t.userId] }), index("event_members_user_idx").on(t.userId)],
);

// ---------------------------------------------------------------- records
export const countSessions = pgTable(
  "count_sessions",
  {
    id: uuid("id").primaryKey(), // made on the device
    eventId: uuid("event_id")
      .notNull()
      .references(() => events.id, { onDelete: "cascade" }),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    zoneId: uuid("zone_id").references(() => zones.id, { onDelete: "set null" }),
    kind: sessionKind("kind").notNull(),
    startedAt: timestamp("started_at", { withTimezone: true, mode: "date" }).notNull(),
    endedAt: timestamp("ended_at", { withTimezone: true, mode: "date" }),
    allSpeciesNoted: boolean("all_species_noted").notNull().default(false),
    distanceM: real("distance_m"),
    notes: text("notes").notNull().default(""),
    createdAt: createdAt(),
  },
  (t) => [
    check("count_sessions_ends_after_starts", sql`${t.endedAt} IS NULL OR ${t.endedAt} > ${t.startedAt}`),
    check("count_sessions_distance_nonneg", sql`${t.distanceM} IS NULL OR ${t.distanceM} >= 0`),
    check("count_sessions_complete_needs_end", sql`NOT ${t.allSpeciesNoted} OR ${t.endedAt} IS NOT NULL`),
    index("count_sessions_event_idx").on(t.eventId, t.zoneId),
    index("count_sessions_user_idx").on(t.userId),
  ],
);

// Partitioned by HASH (event_id), 16 partitions (issue 18, migration 0025_sightings_partitioned;
// drizzle-kit has no partition syntax, so the partitions live in that migration only). The
// primary key must hold the partition key: (id, event_id), id first so that a look-up by id
// alone is one index probe per partition.
export const sightings = pgTable(
  "sightings",
  {
    id: uuid("id").notNull(), // made on the device, so a resend is harmless
    eventId: uuid("event_id")
      .notNull()
      .references(() => events.id, { onDelete: "cascade" }),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    sessionId: uuid("session_id").references(() => countSessions.id, { onDelete: "set null" }),
    taxonId: uuid("taxon_id").references(() => taxa.id, { onDelete: "restrict" }), // null: unidentified
    description: text("description").notNull().default(""),
    count: integer("count").notNull(),
    countIsEstimate: boolean("count_is_estimate").notNull().default(false),
    observedAt: timestamp("observed_at", { withTimezone: true, mode: "date" }).notNull(),
    location: point("location").notNull(),
    accuracyM: real("accuracy_m").notNull(),
    zoneId: uuid("zone_id").references(() => zones.id, { onDelete: "set null" }),
    notes: text("notes").notNull().default(""),
    reviewState: reviewState("review_state").notNull().default("pending"),
    version: integer("version").notNull().default(1), // optimistic concurrency for review decisions
    // Withdrawn by its volunteer (design.md "correction"): rejected with reason "withdrawn", never approved again.
    withdrawnAt: timestamp("withdrawn_at", { withTimezone: true, mode: "date" }),
    checkMarks: checkMark("check_marks")
      .array()
      .notNull()
      .default(sql`ARRAY[]::check_mark[]`),
    // Where the record came from: sent from a phone, or typed in from a paper sheet by `transcribedBy`.
    source: sightingSource("source").notNull().default("phone"),
    transcribedBy: uuid("transcribed_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(), // received by the server
    updatedAt: timestamp("updated_at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
  },
  (t) => [
    check("sightings_count_positive", sql`${t.count} >= 1`),
    check("sightings_accuracy_nonneg", sql`${t.accuracyM} >= 0`),
    check(
      "sightings_location_wgs84",
      sql`ST_X(${t.location}) BETWEEN -180 AND 180 AND ST_Y(${t.location}) BETWEEN -90 AND 90`,
    ),
    check("sightings_identified_or_described", sql`${t.taxonId} IS NOT NULL OR length(btrim(${t.description})) > 0`),
    check("sightings_withdrawn_not_approved", sql`${t.withdrawnAt} IS NULL OR ${t.reviewState} <> 'approved'`),
    index("sightings_queue_idx").on(t.eventId, t.reviewState, t.createdAt, t.id),
    // The review queue, newest or oldest observed first, with and without a state filter.
    index("sightings_queue_observed_idx").on(t.eventId, t.reviewState, t.observedAt, t.id),
    index("sightings_queue_all_observed_idx").on(t.eventId, t.observedAt, t.id),
    index("sightings_duplicate_idx").on(t.eventId, t.userId, t.taxonId, t.observedAt), // the "possible duplicate" check mark
    index("sightings_results_idx").on(t.eventId, t.reviewState, t.taxonId),
    // Incremental pulls through the API: an event's sightings in order of their last change.
    index("sightings_modified_idx").on(t.eventId, t.updatedAt, t.id),
    index("sightings_session_idx").on(t.sessionId),
    index("sightings_user_idx").on(t.userId, t.observedAt),
    index("sightings_location_gist").using("gist", t.location),
    primaryKey({ name: "sightings_pkey", columns: [t.id, t.eventId] }),
  ],
);

export const photos = pgTable(
  "photos",
  {
    id: uuid("id").primaryKey(), // made on the device
    sightingId: uuid("sighting_id").notNull(),
    // The sighting's event (sightings are partitioned by event: the foreign key carries it).
    eventId: uuid("event_id").notNull(),
    storageKey: text("storage_key").notNull().unique(),
    contentType: varchar("content_type", { length: 40 }).notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    sha256: varchar("sha256", { length: 64 }).notNull(),
    width: integer("width"),
    height: integer("height"),
    createdAt: createdAt(),
  },
  (t) => [
    check("photos_type", sql`${t.contentType} IN ('image/jpeg', 'image/png', 'image/webp')`),
    check("photos_size", sql`${t.sizeBytes} > 0 AND ${t.sizeBytes} <= 20000000`),
    check("photos_sha256_hex", sql`${t.sha256} ~ '^[0-9a-f]{64}$'`),
    index("photos_sighting_idx").on(t.sightingId),
    foreignKey({
      name: "photos_sighting_id_sightings_id_fk",
      columns: [t.sightingId, t.eventId],
      foreignColumns: [sightings.id, sightings.eventId],
    }).onDelete("cascade"),
  ],
);

// Append-only: a trigger (migration 0002) refuses UPDATE and DELETE.
export const reviews = pgTable(
  "reviews",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    sightingId: uuid("sighting_id").notNull(),
    eventId: uuid("event_id").notNull(), // the sighting's event (the foreign key carries it)
    reviewerId: uuid("reviewer_id")
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    decidedAt: timestamp("decided_at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
    fromState: reviewState("from_state").notNull(),
    toState: reviewState("to_state").notNull(),
    fromTaxonId: uuid("from_taxon_id").references(() => taxa.id),
    toTaxonId: uuid("to_taxon_id").references(() => taxa.id),
    reason: text("reason").notNull().default(""),
    message: text("message").notNull().default(""), // the question to the volunteer, or their answer
    // An undo is a decision of its own that puts back the state and taxon before the decision it names.
    undoesId: bigint("undoes_id", { mode: "number" }).references((): AnyPgColumn => reviews.id),
  },
  (t) => [
    index("reviews_sighting_idx").on(t.sightingId, t.decidedAt),
    foreignKey({
      name: "reviews_sighting_id_sightings_id_fk",
      columns: [t.sightingId, t.eventId],
      foreignColumns: [sightings.id, sightings.eventId],
    }).onDelete("restrict"),
  ],
);

/**
 * Every earlier version of a sighting's content (design.md "correction": the history keeps
 * every version): when the volunteer corrects a sent sighting or answers a question with
 * changes, the values it had at `version` are kept here before the row changes. Append-only.
 */
export const sightingVersions = pgTable(
  "sighting_versions",
  {
    sightingId: uuid("sighting_id").notNull(),
    eventId: uuid("event_id").notNull(), // the sighting's event (the foreign key carries it)
    version: integer("version").notNull(), // the sighting's version while it held these values
    sessionId: uuid("session_id"),
    taxonId: uuid("taxon_id").references(() => taxa.id, { onDelete: "restrict" }),
    description: text("description").notNull(),
    count: integer("count").notNull(),
    countIsEstimate: boolean("count_is_estimate").notNull(),
    observedAt: timestamp("observed_at", { withTimezone: true, mode: "date" }).notNull(),
    location: point("location").notNull(),
    accuracyM: real("accuracy_m").notNull(),
    notes: text("notes").notNull(),
    replacedAt: timestamp("replaced_at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ columns: [t.sightingId, t.version] }),
    foreignKey({
      name: "sighting_versions_sighting_id_sightings_id_fk",
      columns: [t.sightingId, t.eventId],
      foreignColumns: [sightings.id, sightings.eventId],
    }).onDelete("restrict"),
  ],
);

export const emailOutbox = pgTable(
  "email_outbox",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    toAddress: text("to_address").notNull(),
    kind: varchar("kind", { length: 40 }).notNull(),
    locale: varchar("locale", { length: 8 }).notNull().default("en"),
    subject: text("subject").notNull(),
    textBody: text("text_body").notNull(),
    htmlBody: text("html_body"),
    status: outboxStatus("status").notNull().default("queued"),
    attempts: smallint("attempts").notNull().default(0),
    lastError: text("last_error"),
    sendAfter: timestamp("send_after", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
    sentAt: timestamp("sent_at", { withTimezone: true, mode: "date" }),
    createdAt: createdAt(),
  },
  (t) => [index("email_outbox_due_idx").on(t.status, t.sendAfter)],
);

// A published report's input records (lib/results/records.ts), one row per report in a compact
// columnar form (db/queries/report-inputs.ts): ids as uuid[], every other string as its position
// in `words` (0 for null). Written just before its report (reports.id references it, so no report
// is without inputs); append-only like the reports (trigger of migration …_report_inputs_compact).
export const reportInputs = pgTable(
  "report_inputs",
  {
    reportId: uuid("report_id").primaryKey(),
    recordCount: integer("record_count").notNull(),
    ids: uuid("ids").array().notNull(),
    words: text("words").array().notNull(),
    states: integer("states").array().notNull(),
    taxa: integer("taxa").array().notNull(),
    counts: integer("counts").array().notNull(),
    zones: integer("zones").array().notNull(),
    sessions: integer("sessions").array().notNull(),
    sessionZones: integer("session_zones").array().notNull(),
  },
  (t) => [
    check(
      "report_inputs_lengths",
      sql`cardinality(${t.ids}) = ${t.recordCount} AND cardinality(${t.states}) = ${t.recordCount} AND cardinality(${t.taxa}) = ${t.recordCount} AND cardinality(${t.counts}) = ${t.recordCount} AND cardinality(${t.zones}) = ${t.recordCount} AND cardinality(${t.sessions}) = ${t.recordCount} AND cardinality(${t.sessionZones}) = ${t.recordCount}`,
    ),
  ],
);

// A published report never changes: a trigger (migration 0002) refuses UPDATE and DELETE.
// Its input records are in report_inputs (the row of the same id).
export const reports = pgTable(
  "reports",
  {
    id: uuid("id")
      .primaryKey()
      .defaultRandom()
      .references(() => reportInputs.reportId, { onDelete: "restrict" }),
    eventId: uuid("event_id")
      .notNull()
      .references(() => events.id, { onDelete: "restrict" }),
    version: integer("version").notNull(),
    publishedAt: timestamp("published_at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
    publishedBy: uuid("published_by")
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    engineVersion: text("engine_version").notNull(),
    inputHash: varchar("input_hash", { length: 64 }).notNull(),
    results: jsonb("results").notNull(),
    methodNotes: jsonb("method_notes").notNull(),
    changes: jsonb("changes")
      .notNull()
      .default(sql`'[]'::jsonb`),
    // The organiser's optional note at publishing, shown on the report page.
    note: text("note").notNull().default(""),
    // The event beside an earlier event of the same site as it stood at publishing
    // (lib/results/compare-events.ts), or null when there was none: a fact declared at
    // publishing, like the pending counts, not re-computed from this report's inputs.
    besideEarlier: jsonb("beside_earlier"),
  },
  (t) => [
    uniqueIndex("reports_event_version_key").on(t.eventId, t.version),
    check("reports_version_positive", sql`${t.version} >= 1`),
    check("reports_hash_hex", sql`${t.inputHash} ~ '^[0-9a-f]{64}$'`),
  ],
);

// A withdrawn report version (issue 16): the report and its data stay, its page says it was
// withdrawn and why. One row per version; append-only like the reports (migration trigger).
export const reportWithdrawals = pgTable(
  "report_withdrawals",
  {
    reportId: uuid("report_id")
      .primaryKey()
      .references(() => reports.id, { onDelete: "restrict" }),
    withdrawnAt: timestamp("withdrawn_at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
    withdrawnBy: uuid("withdrawn_by")
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    reason: text("reason").notNull(),
  },
  (t) => [check("report_withdrawals_reason_nonempty", sql`length(btrim(${t.reason})) > 0`)],
);

// ---------------------------------------------------------------- invitations, rate limits, membership log
// An invitation (by an organiser) or a join request (through an event's join code) waits
// here until the person signs in with that address; then it becomes an event membership.
export const invitations = pgTable(
  "invitations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    eventId: uuid("event_id")
      .notNull()
      .references(() => events.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    name: text("name"),
    role: eventRole("role").notNull(),
    taxonGroups: taxonGroup("taxon_groups")
      .array()
      .notNull()
      .default(sql`ARRAY[]::taxon_group[]`),
    invitedBy: uuid("invited_by").references(() => users.id, { onDelete: "set null" }), // null: self-service join
    createdAt: createdAt(),
    acceptedAt: timestamp("accepted_at", { withTimezone: true, mode: "date" }),
    revokedAt: timestamp("revoked_at", { withTimezone: true, mode: "date" }),
  },
  (t) => [index("invitations_email_idx").on(sql`lower(${t.email})`), index("invitations_event_idx").on(t.eventId)],
);

// Sign-in tries, for the per-address and per-IP limits. Old rows are pruned as new ones arrive.
export const signInAttempts = pgTable(
  "sign_in_attempts",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    key: text("key").notNull(), // "email:<address>" or "ip:<address>"
    at: timestamp("at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
  },
  (t) => [index("sign_in_attempts_key_at_idx").on(t.key, t.at)],
);

export const membershipAction = pgEnum("membership_action", MEMBERSHIP_ACTIONS);

// Every change to who holds which role in an event (append-only, like reviews).
export const membershipLog = pgTable(
  "membership_log",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    eventId: uuid("event_id")
      .notNull()
      .references(() => events.id, { onDelete: "cascade" }),
    subjectEmail: text("subject_email").notNull(),
    subjectUserId: uuid("subject_user_id").references(() => users.id, { onDelete: "set null" }),
    actorId: uuid("actor_id").references(() => users.id, { onDelete: "set null" }),
    action: membershipAction("action").notNull(),
    fromRole: eventRole("from_role"),
    toRole: eventRole("to_role"),
    taxonGroups: taxonGroup("taxon_groups").array(),
    at: timestamp("at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
  },
  (t) => [index("membership_log_event_idx").on(t.eventId, t.at)],
);

// ---------------------------------------------------------------- review digests
// One row per review decision that the volunteer should hear about, written in the same
// transaction as the decision. The mail worker gathers a volunteer's waiting rows into one
// digest (at most one per volunteer per hour) and links them to its outbox mail, so a
// failed send never loses a decision: the mail stays in the outbox and is retried.
export const reviewNotices = pgTable(
  "review_notices",
  {
    reviewId: bigint("review_id", { mode: "number" })
      .primaryKey()
      .references(() => reviews.id, { onDelete: "restrict" }),
    volunteerId: uuid("volunteer_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    createdAt: createdAt(),
    digestId: bigint("digest_id", { mode: "number" }).references(() => emailOutbox.id, { onDelete: "set null" }),
  },
  (t) => [
    index("review_notices_waiting_idx")
      .on(t.volunteerId, t.createdAt)
      .where(sql`${t.digestId} IS NULL`),
  ],
);
// ---------------------------------------------------------------- results aggregates (issue 7)
// Like sightings, every aggregate table keyed by event (all below but result_stamps) is
// partitioned by HASH (event_id) in 16 partitions (migration 0025_sightings_partitioned).
// Kept in step with approved sightings by statement-level triggers (migration 0007), so
// the results page reads a few thousand aggregate rows instead of grouping every sighting.
// zone_key is the zone, or the nil UUID for a sighting outside every zone.
export const resultTaxonCounts = pgTable(
  "result_taxon_counts",
  {
    eventId: uuid("event_id").notNull(),
    zoneKey: uuid("zone_key").notNull(),
    taxonId: uuid("taxon_id").notNull(),
    individuals: bigint("individuals", { mode: "number" }).notNull(),
    sightings: integer("sightings").notNull(),
  },
  (t) => [primaryKey({ columns: [t.eventId, t.zoneKey, t.taxonId] })],
);

// The unusual-count check mark's statistics (issue 18): how many non-rejected sightings of
// each taxon at each event carry each count, kept by statement-level triggers on sightings
// (the check_count_stats migration), so that the quartiles are read from a few rows instead of every sighting
// of the taxon. `shard`: each writing transaction holds one of 32 shards (an advisory lock), so
// that simultaneous sync batches never wait on each other's row locks; readers sum the shards.
export const checkCountStats = pgTable(
  "check_count_stats",
  {
    eventId: uuid("event_id").notNull(),
    taxonId: uuid("taxon_id").notNull(),
    count: integer("count").notNull(),
    shard: smallint("shard").notNull(),
    n: integer("n").notNull(),
  },
  (t) => [primaryKey({ columns: [t.eventId, t.taxonId, t.count, t.shard] })],
);

// Presence of a taxon in a count session (approved sightings only); whether the session
// counts as a complete incidence sample, and its zone, are read from count_sessions.
export const resultSessionTaxa = pgTable(
  "result_session_taxa",
  {
    eventId: uuid("event_id").notNull(),
    sessionId: uuid("session_id").notNull(),
    taxonId: uuid("taxon_id").notNull(),
    sightings: integer("sightings").notNull(),
  },
  (t) => [primaryKey({ columns: [t.eventId, t.sessionId, t.taxonId] })],
);

// Issue 14 (results' first read): a small integer per taxon (kept for every taxon by a
// trigger on taxa), and each count session's present taxa as one text of those codes,
// ascending and comma-separated, kept from result_session_taxa by triggers (migration 0024),
// so the results read one row per session instead of one per (session, taxon), as text
// (an int[] column read as text costs about twice as much to send).
export const resultTaxonCodes = pgTable("result_taxon_codes", {
  taxonId: uuid("taxon_id")
    .primaryKey()
    .references(() => taxa.id, { onDelete: "cascade" }),
  code: integer("code").notNull().unique().generatedAlwaysAsIdentity(),
});

export const resultSessionLists = pgTable(
  "result_session_lists",
  {
    eventId: uuid("event_id").notNull(),
    sessionId: uuid("session_id").notNull(),
    taxa: text("taxa").notNull(),
  },
  (t) => [primaryKey({ columns: [t.eventId, t.sessionId] })],
);

// Sightings of each count session by zone, whatever their review state (issue 14): the
// zone a session counts in (the one holding most of its sightings) is read from these
// rows instead of every sighting. zone_key as in result_taxon_counts.
export const resultSessionZones = pgTable(
  "result_session_zones",
  {
    eventId: uuid("event_id").notNull(),
    sessionId: uuid("session_id").notNull(),
    zoneKey: uuid("zone_key").notNull(),
    sightings: integer("sightings").notNull(),
  },
  (t) => [primaryKey({ columns: [t.eventId, t.sessionId, t.zoneKey] })],
);

// Pending and returned sightings per (count session, volunteer); session_key is the nil
// UUID for sightings outside a session. Whether the session is complete is read from
// count_sessions. Keyed finer than the event so that volunteers syncing at the same time
// never wait on one shared row.
export const resultPending = pgTable(
  "result_pending",
  {
    eventId: uuid("event_id").notNull(),
    sessionKey: uuid("session_key").notNull(),
    userId: uuid("user_id").notNull(),
    pending: integer("pending").notNull(),
    returned: integer("returned").notNull(),
  },
  (t) => [primaryKey({ columns: [t.eventId, t.sessionKey, t.userId] })],
);

// One counter per event, raised by the same triggers whenever the event's aggregates
// change: the results path keys its cache on it (with the sessions, zones and taxa).
export const resultStamps = pgTable("result_stamps", {
  eventId: uuid("event_id").primaryKey(),
  seq: bigint("seq", { mode: "number" }).notNull().default(1),
});

// ---------------------------------------------------------------- read-only API tokens (issue 19)
// A token reads one event's data, or every event of one organisation (event_id NULL). Only
// the SHA-256 of the secret is kept; `prefix` (the first characters of the secret) lets an
// organiser recognise it in the list. Each call counts in a one-minute window kept on the
// row itself, so the per-token limit holds across app instances.
export const apiTokens = pgTable(
  "api_tokens",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: uuid("organisation_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "cascade" }),
    eventId: uuid("event_id").references(() => events.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    prefix: varchar("prefix", { length: 16 }).notNull(),
    tokenHash: varchar("token_hash", { length: 64 }).notNull().unique(),
    createdBy: uuid("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    expiresAt: timestamp("expires_at", { withTimezone: true, mode: "date" }).notNull(),
    revokedAt: timestamp("revoked_at", { withTimezone: true, mode: "date" }),
    revokedBy: uuid("revoked_by").references(() => users.id, { onDelete: "set null" }),
    lastUsedAt: timestamp("last_used_at", { withTimezone: true, mode: "date" }),
    windowStartedAt: timestamp("window_started_at", { withTimezone: true, mode: "date" }),
    windowCalls: integer("window_calls").notNull().default(0),
  },
  (t) => [
    check("api_tokens_expires_after_created", sql`${t.expiresAt} > ${t.createdAt}`),
    check("api_tokens_hash_shape", sql`${t.tokenHash} ~ '^[0-9a-f]{64}$'`),
    check("api_tokens_name_nonempty", sql`length(btrim(${t.name})) > 0`),
    index("api_tokens_organisation_idx").on(t.organisationId),
    index("api_tokens_event_idx").on(t.eventId),
  ],
);

// ---------------------------------------------------------------- organisations that start on their own (issue 19)
export const organisationRequestState = pgEnum("organisation_request_state", ORGANISATION_REQUEST_STATES);
export const organisationLogAction = pgEnum("organisation_log_action", ORGANISATION_LOG_ACTIONS);
export const adminAction = pgEnum("admin_action", ADMIN_ACTIONS);

// A signed-in person's request for a new organisation; the site admin approves (the
// organisation is made, the person its first organiser) or declines with a reason.
export const organisationRequests = pgTable(
  "organisation_requests",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    requestedBy: uuid("requested_by")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    contactEmail: text("contact_email").notNull(),
    country: varchar("country", { length: 2 }).notNull(),
    description: text("description").notNull(),
    state: organisationRequestState("state").notNull().default("pending"),
    decidedBy: uuid("decided_by").references(() => users.id, { onDelete: "set null" }),
    decidedAt: timestamp("decided_at", { withTimezone: true, mode: "date" }),
    reason: text("reason").notNull().default(""),
    organisationId: uuid("organisation_id").references(() => organisations.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [
    index("organisation_requests_state_idx").on(t.state, t.createdAt),
    index("organisation_requests_user_idx").on(t.requestedBy),
    check("organisation_requests_country_shape", sql`${t.country} ~ '^[A-Z]{2}$'`),
  ],
);

// Every change to an organisation and its organisers (append-only: migration trigger).
// People are kept as plain ids and addresses, so the log outlives an erased account.
export const organisationLog = pgTable(
  "organisation_log",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    organisationId: uuid("organisation_id").references(() => organisations.id, { onDelete: "restrict" }),
    requestId: uuid("request_id").references(() => organisationRequests.id, { onDelete: "restrict" }),
    action: organisationLogAction("action").notNull(),
    actorId: uuid("actor_id"),
    subjectUserId: uuid("subject_user_id"),
    subjectEmail: text("subject_email"),
    reason: text("reason").notNull().default(""),
    at: timestamp("at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
  },
  (t) => [index("organisation_log_org_idx").on(t.organisationId, t.at), index("organisation_log_at_idx").on(t.at)],
);

// What site admins did to people and mails (append-only: migration trigger).
export const adminLog = pgTable(
  "admin_log",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    actorId: uuid("actor_id").notNull(),
    action: adminAction("action").notNull(),
    subjectUserId: uuid("subject_user_id"),
    subjectEmail: text("subject_email"),
    mailId: bigint("mail_id", { mode: "number" }),
    reason: text("reason").notNull().default(""),
    at: timestamp("at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
  },
  (t) => [index("admin_log_at_idx").on(t.at)],
);

// The last round of each background worker (the mail worker), for the admin console's health view.
export const workerRuns = pgTable("worker_runs", {
  worker: varchar("worker", { length: 40 }).primaryKey(),
  lastRunAt: timestamp("last_run_at", { withTimezone: true, mode: "date" }).notNull(),
  summary: text("summary").notNull().default(""),
  lastError: text("last_error"),
});
