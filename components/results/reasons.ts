import type { getTranslations } from "next-intl/server";
import type { Block, Reason } from "@/lib/results/compute";
import { SUFFICIENCY } from "@/lib/results/settings";

type T = Awaited<ReturnType<typeof getTranslations<"Results">>>;

/** The reasons a block has no estimates of some kind, in words ("fewer than 20 individuals; …"). */
export function reasonsText(t: T, reasons: readonly Reason[], block: Pick<Block, "countUnits">): string {
  return reasons
    .map((r) => {
      switch (r) {
        case "countUnits":
          return t("tooFew.reasons.countUnits", { units: block.countUnits.map((u) => t(`unit.${u}`)).join(", ") });
        case "individuals":
          return t("tooFew.reasons.individuals", { min: SUFFICIENCY.minIndividuals });
        case "coverage":
          return t("tooFew.reasons.coverage", { min: SUFFICIENCY.minCoverage });
        case "sessions":
          return t("tooFew.reasons.sessions", { min: SUFFICIENCY.minCompleteSessions });
        case "incidenceCoverage":
          return t("tooFew.reasons.incidenceCoverage", { min: SUFFICIENCY.minCoverage });
      }
    })
    .join("; ");
}

export const ABUNDANCE_REASONS: readonly Reason[] = ["countUnits", "individuals", "coverage"];
export const INCIDENCE_REASONS: readonly Reason[] = ["sessions", "incidenceCoverage"];
