// The rules that turn records into numbers, as named settings (README "Statistics").
// Every value here is the project's own choice unless a source is named.

/** What a count means, per taxon group of an event (table event_count_units). */
export const COUNT_UNITS = ["individuals", "stems", "clumps", "colonies", "presence"] as const;
export type CountUnit = (typeof COUNT_UNITS)[number];

/**
 * Defaults when an event has not said otherwise (the project's own choice): animals are
 * counted as individuals; vascular plants as individual plants too, since volunteers
 * count plants they can tell apart (an organiser who counts stems or clumps says so);
 * a fungus fruits many bodies from one organism, so fungi count as presence only.
 */
export const DEFAULT_COUNT_UNITS: Record<string, CountUnit> = {
  birds: "individuals",
  vascular_plants: "individuals",
  insects: "individuals",
  fungi: "presence",
  mammals: "individuals",
  amphibians_reptiles: "individuals",
  molluscs: "individuals",
  other: "individuals",
};

export const countUnitOf = (group: string, overrides: Readonly<Record<string, CountUnit>> = {}): CountUnit =>
  overrides[group] ?? DEFAULT_COUNT_UNITS[group] ?? "individuals";

/**
 * Sufficiency (the project's own thresholds; rules of thumb, common practice): below
 * them a block is "too few records" and gets no estimates. Abundance-based estimates
 * need MIN_INDIVIDUALS and sample coverage ≥ MIN_COVERAGE; incidence-based estimates
 * need MIN_COMPLETE_SESSIONS and incidence coverage ≥ MIN_COVERAGE.
 */
export const SUFFICIENCY = {
  minIndividuals: 20,
  minCompleteSessions: 3,
  minCoverage: 0.5,
} as const;

/**
 * Comparisons: the difference of two zones' richness at equal coverage, with a bootstrap
 * interval (Chao et al. 2014 assemblage, observed difference ± 1.96 bootstrap sd).
 * "More"/"fewer" only when that interval excludes 0.
 */
export const COMPARISON_BOOTSTRAP = { replicates: 200, seed: 20120901 } as const;

/**
 * Intervals of the zone × zone similarity table (the project's own choice, like the
 * comparison's): a percentile bootstrap of each pair, individuals redrawn from each zone's
 * observed proportions (or complete sessions redrawn with replacement within each zone),
 * with a fixed seed so a report reproduces exactly.
 */
export const SIMILARITY_BOOTSTRAP = { replicates: 200, seed: 20050301 } as const;

/**
 * Hill-number curves and profile on the results page and in reports (the project's own
 * choice, for speed): a fixed number of bootstrap replicates instead of the engine's
 * adaptive default (up to 2,000 for curves, 10,000 for the profile), with a fixed seed
 * recorded in every report, and `points` sizes from 1 to twice the sample (plus the
 * sample itself). With 100 replicates a band limit moves by a few per cent under another
 * seed on small samples (lib/diversity/hill-noise.test.ts measures the engine's moves);
 * the method notes say so.
 */
export const HILL_RESULTS = {
  replicates: 100,
  seed: 20140101,
  points: 16,
  profileOrders: [0, 0.25, 0.5, 0.75, 1, 1.25, 1.5, 1.75, 2],
} as const;
