// The domain's closed lists (design.md "Words"), each written once. db/schema.ts builds
// its PostgreSQL enums from these tuples, zod schemas use z.enum(LIST) and the UI uses the
// types, so a state or role is never spelt by hand anywhere else.
// Pure: no database, no framework. The order of a list that backs a PostgreSQL enum is
// the enum's order: change it only with a migration.

/** Review states of a sighting: sent and not yet reviewed, approved, rejected, or returned with a question. */
export const REVIEW_STATES = ["pending", "approved", "rejected", "returned"] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];

/**
 * Where a record is on its way from the phone: in the outbox, on the wire, accepted, or
 * refused by the server with its reason. The refused state is stored as "failed" on phones
 * (IndexedDB), so that value stays as long as phones hold records written with it.
 */
export const DEVICE_STATES = ["waiting", "sending", "sent", "failed"] as const;
export type DeviceState = (typeof DEVICE_STATES)[number];

/** open: shown as recorded; generalised: public locations coarsened; restricted: exact location seen only by organisers and coordinators. */
export const SENSITIVITIES = ["open", "generalised", "restricted"] as const;
export type Sensitivity = (typeof SENSITIVITIES)[number];

/** A person's role in one event. */
export const EVENT_ROLES = ["organiser", "coordinator", "volunteer"] as const;
export type EventRole = (typeof EVENT_ROLES)[number];

/** A person's role in an organisation. */
export const ORG_ROLES = ["organiser", "member"] as const;
export type OrgRole = (typeof ORG_ROLES)[number];

/** A person's effective role in an event: an event role, or site admin (users.is_admin), who passes every role check. */
export const SITE_ADMIN = "admin";
export type EffectiveRole = EventRole | typeof SITE_ADMIN;

export const TAXON_RANKS = ["family", "genus", "species", "subspecies", "variety", "form"] as const;
export type TaxonRank = (typeof TAXON_RANKS)[number];

export const TAXON_GROUPS = [
  "birds",
  "vascular_plants",
  "insects",
  "fungi",
  "mammals",
  "amphibians_reptiles",
  "molluscs",
  "other",
] as const;
export type TaxonGroup = (typeof TAXON_GROUPS)[number];

export const HABITATS = [
  "interior",
  "edge",
  "wetland",
  "open_water",
  "grassland",
  "woodland",
  "urban",
  "other",
] as const;
export type Habitat = (typeof HABITATS)[number];

/** Count-session kinds: a timed point count, a transect walk, a plot search. */
export const SESSION_KINDS = ["timed_count", "walk", "plot_search"] as const;
export type SessionKind = (typeof SESSION_KINDS)[number];

/** Where a sighting came from: the field log on a phone, or a transcribed paper sheet. */
export const SIGHTING_SOURCES = ["phone", "paper_sheet"] as const;
export type SightingSource = (typeof SIGHTING_SOURCES)[number];

/** Automatic hints on a sighting for reviewers. */
export const CHECK_MARKS = [
  "outside_area",
  "outside_dates",
  "high_count",
  "not_on_list",
  "sensitive_taxon",
  "photo_missing",
  "possible_duplicate",
  "poor_accuracy",
] as const;
export type CheckMark = (typeof CHECK_MARKS)[number];

export const EVENT_STATUSES = ["draft", "open", "closed"] as const;
export type EventStatus = (typeof EVENT_STATUSES)[number];

/** Why a coordinator rejects a sighting; stored in reviews.reason as these codes (free text may follow). */
export const REJECT_REASONS = [
  "misidentified",
  "duplicate",
  "outside_event",
  "insufficient_evidence",
  "other",
] as const;
export type RejectReason = (typeof REJECT_REASONS)[number];

/** A mail in the e-mail queue (email_outbox). */
export const MAIL_STATUSES = ["queued", "sending", "sent", "failed"] as const;
export type MailStatus = (typeof MAIL_STATUSES)[number];

/** A request for a new organisation, waiting for the site admin (organisation_requests). */
export const ORGANISATION_REQUEST_STATES = ["pending", "approved", "declined"] as const;
export type OrganisationRequestState = (typeof ORGANISATION_REQUEST_STATES)[number];

/** What happened to an organisation (organisation_log, append-only). */
export const ORGANISATION_LOG_ACTIONS = [
  "requested",
  "approved",
  "declined",
  "organiser_added",
  "organiser_removed",
  "suspended",
  "reinstated",
] as const;
export type OrganisationLogAction = (typeof ORGANISATION_LOG_ACTIONS)[number];

/** What a site admin did to a person or a mail (admin_log, append-only). */
export const ADMIN_ACTIONS = [
  "account_locked",
  "account_unlocked",
  "sessions_ended",
  "mail_retried",
  "account_erased",
] as const;
export type AdminAction = (typeof ADMIN_ACTIONS)[number];

/** Changes to who holds which role in an event (membership_log). */
export const MEMBERSHIP_ACTIONS = ["invited", "joined", "role_changed", "removed", "invitation_revoked"] as const;
export type MembershipAction = (typeof MEMBERSHIP_ACTIONS)[number];
