// What a person downloads about themselves (GET /api/account/data): the JSON's shape.

export type MySightingRow = {
  id: string;
  event: string;
  eventSlug: string;
  scientificName: string | null;
  description: string;
  count: number;
  countIsEstimate: boolean;
  observedAt: string;
  latitude: number;
  longitude: number;
  accuracyM: number;
  zone: string | null;
  sessionId: string | null;
  notes: string;
  reviewState: string;
  receivedAt: string;
  photos: { id: string; contentType: string; sizeBytes: number; sha256: string }[];
  decisions: {
    decidedAt: string;
    fromState: string;
    toState: string;
    fromTaxon: string | null;
    toTaxon: string | null;
    reason: string;
    message: string;
  }[];
};

export type MyData = {
  exportedAt: string;
  account: {
    id: string;
    email: string;
    name: string | null;
    publishedName: string | null;
    publishConsentAt: string | null;
    locale: string;
    hasPassword: boolean;
    emailVerifiedAt: string | null;
    createdAt: string;
  };
  eventRoles: { event: string; eventSlug: string; role: string; taxonGroups: string[]; since: string }[];
  organisationRoles: { organisation: string; role: string }[];
  membershipLog: { event: string; action: string; fromRole: string | null; toRole: string | null; at: string }[];
  invitations: { event: string; name: string | null; role: string; createdAt: string; acceptedAt: string | null }[];
  countSessions: {
    id: string;
    event: string;
    kind: string;
    zone: string | null;
    startedAt: string;
    endedAt: string | null;
    allSpeciesNoted: boolean;
    distanceM: number | null;
    notes: string;
  }[];
  sightings: MySightingRow[];
  decisionsMade: { sightingId: string; decidedAt: string; fromState: string; toState: string; reason: string }[];
};
