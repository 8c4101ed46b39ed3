// What the public may read of an event's results (issue 13). Zones are a few hundred metres
// across, so a count of a sensitive taxon in one zone is a location finer than its
// generalisation (0.1° cell) and defeats "restricted: withheld". Public outputs (the report
// page, species.csv, the token API) therefore give sensitive taxa at event level at most:
// - generalised taxa: listed with their event total, never by zone;
// - restricted taxa: listed with their event total (the default), or not listed at all when
//   the organiser chooses so for the event.
// Zone-level numbers (richness, estimates, curves, comparison) are still computed with every
// taxon: they name no taxon. The organiser's own results page reads the full results.
import type { SpeciesRow } from "./compute";
import type { Sensitivity } from "@/lib/domain";

/** How restricted taxa appear in public: with their event total only, or not at all. */
export const RESTRICTED_LISTINGS = ["event", "hidden"] as const;
export type RestrictedListing = (typeof RESTRICTED_LISTINGS)[number];

const ORDER: Record<Sensitivity, number> = { open: 0, generalised: 1, restricted: 2 };

/** The stricter of two sensitivities (a taxon raised after publication is treated at its new level). */
export function stricter(a: Sensitivity, b: Sensitivity | undefined): Sensitivity {
  return b && ORDER[b] > ORDER[a] ? b : a;
}

export type PublicPolicy = {
  restricted: RestrictedListing;
  /** Taxa's current sensitivity, where it may be stricter than the one the results recorded. */
  current?: ReadonlyMap<string, Sensitivity>;
};

type WithSpecies = { species: SpeciesRow[] };

/** Results safe to show the public: no sensitive taxon by zone, restricted ones hidden if asked. */
export function publicResults<T extends WithSpecies>(results: T, policy: PublicPolicy): T {
  const species: SpeciesRow[] = [];
  for (const s of results.species) {
    const sensitivity = stricter(s.sensitivity, policy.current?.get(s.id));
    if (sensitivity === "open") {
      species.push(s);
      continue;
    }
    if (sensitivity === "restricted" && policy.restricted === "hidden") continue;
    species.push({ ...s, sensitivity, byZone: {} });
  }
  return { ...results, species };
}

/** Whether a species row may be broken down by zone in public. */
export const zoneListable = (s: Pick<SpeciesRow, "sensitivity">) => s.sensitivity === "open";
