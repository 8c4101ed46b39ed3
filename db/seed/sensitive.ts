// Approved records of the demo's sensitive taxa (issue 7), so that every public output has
// something to generalise or withhold. The exact coordinates are exported for the tests
// that scan every public byte for them.
export const SENSITIVE_DEMO_RECORDS = [
  {
    key: "badger-1",
    scientificName: "Meles meles",
    volunteer: "vol-2",
    zone: "beech",
    lon: -1.80437,
    lat: 52.10712,
    count: 3,
    hour: 21,
  },
  {
    key: "badger-2",
    scientificName: "Meles meles",
    volunteer: "vol-5",
    zone: "alder",
    lon: -1.80961,
    lat: 52.10588,
    count: 1,
    hour: 22,
  },
  {
    key: "goshawk-1",
    scientificName: "Accipiter gentilis",
    volunteer: "vol-1",
    zone: "beech",
    lon: -1.80263,
    lat: 52.10841,
    count: 1,
    hour: 10,
  },
  {
    key: "orchid-1",
    scientificName: "Cypripedium calceolus",
    volunteer: "vol-3",
    zone: "beech",
    lon: -1.80712,
    lat: 52.10466,
    count: 4,
    hour: 13,
  },
] as const;
