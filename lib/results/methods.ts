// Each number's published method name, its interval's method and the sources (papers, not
// software); the one-line note on how to read it is translated (messages:
// Results.notes.<key>). Frozen into every report as its method notes.
import { COMPARISON_BOOTSTRAP, HILL_RESULTS, SIMILARITY_BOOTSTRAP, SUFFICIENCY } from "./settings";

export const METHOD_NOTES = [
  {
    key: "ranks",
    name: "Taxon ranks",
    interval: null,
    source:
      "Subspecies and lower fold into their species; a genus or family record counts only when nothing under it is recorded in the same block (event or zone), otherwise its individuals show in the totals only; unidentified records never count. Taxa carry no parent link: the genus is a name's first word, the species a trinomial's first two words; a family counts only when no record of its taxon group is identified to genus or below (project rule)",
  },
  {
    key: "units",
    name: "Sampling units and count units",
    interval: null,
    source:
      "Every complete count session is a sampling unit, also when nothing in it was approved; abundance-based estimates need counts of individuals (Chao 1987; Colwell et al. 2012), so a block holding counts of stems, clumps, colonies or presence only gets incidence-based estimates only (project rule)",
  },
  {
    key: "sessionZone",
    name: "Zone of a record",
    interval: null,
    source:
      "A sighting counts in the zone that covers its own point (PostGIS ST_Covers; the smallest zone if zones touch); a complete session counts in the zone holding most of its sightings, whatever their review state, outside every zone being one more place (ties: the zone it was started in, then the lowest zone id), or, with no sightings, in the zone it was started in (project rule)",
  },
  {
    key: "sufficiency",
    name: "Too few records",
    interval: null,
    source: `No estimates below ${SUFFICIENCY.minIndividuals} individuals, ${SUFFICIENCY.minCompleteSessions} complete sessions or a sample coverage of ${SUFFICIENCY.minCoverage} (project thresholds, rules of thumb); such a block is left out of comparisons`,
  },
  {
    key: "observed",
    name: "Observed richness (S_obs)",
    interval: null,
    source: "count of taxa with at least one approved record, after the rank rule",
  },
  {
    key: "individuals",
    name: "Individuals (n)",
    interval: null,
    source: "sum of approved counts, including records left out of richness by the rank rule",
  },
  {
    key: "chao1",
    name: "Chao1",
    interval: "log-normal",
    source:
      "Chao (1984) with the (n − 1)/n factor of Chiu et al. (2014); bias-corrected form when f2 = 0 (Chao 2005); log-normal interval, Chao (1987). The same number is the asymptotic Hill number of order 0 (Chao et al. 2014)",
  },
  {
    key: "ace",
    name: "ACE",
    interval: "log-normal",
    source:
      "Chao & Lee (1992), rare = 10 or fewer individuals; se by the delta method; log-normal interval, Chao (1987)",
  },
  {
    key: "chao2",
    name: "Chao2",
    interval: "log-normal",
    source:
      "Chao (1987) with the (T − 1)/T factor of Chiu et al. (2014); complete count sessions as sampling units; log-normal interval, Chao (1987)",
  },
  {
    key: "ice",
    name: "ICE",
    interval: "log-normal",
    source:
      "Lee & Chao (1994), infrequent = 10 or fewer sessions (Chazdon et al. 1998); se by the delta method; log-normal interval, Chao (1987)",
  },
  {
    key: "jack1",
    name: "First-order jackknife",
    interval: "normal",
    source: "Burnham & Overton (1978); se Heltshe & Forrester (1983); normal interval (convention)",
  },
  {
    key: "jack2",
    name: "Second-order jackknife",
    interval: null,
    source: "Burnham & Overton (1978); no standard error in common use",
  },
  {
    key: "coverage",
    name: "Sample coverage",
    interval: null,
    source:
      "Chao & Jost (2012): the share of the assemblage's individuals (or, for sessions, incidences) that belong to detected species. Not the same as completeness, the share of species detected (observed ÷ Chao1 or Chao2)",
  },
  {
    key: "hill1",
    name: "Hill number q = 1",
    interval: "bootstrap",
    source:
      "Hill (1973); estimate Chao, Wang & Jost (2013); bootstrap se (Chao et al. 2014 assemblage, 200 replicates, fixed seed), normal interval",
  },
  {
    key: "hill2",
    name: "Hill number q = 2",
    interval: "bootstrap",
    source: "Hill (1973); estimate Chao et al. (2014); bootstrap se (200 replicates, fixed seed), normal interval",
  },
  { key: "shannon", name: "Shannon index H′", interval: null, source: "Shannon (1948), natural logarithm" },
  { key: "simpson", name: "Simpson index (1 − D)", interval: null, source: "Simpson (1949), Gini–Simpson form" },
  { key: "evenness", name: "Pielou evenness J′", interval: null, source: "Pielou (1966)" },
  {
    key: "rarefaction",
    name: "Individual-based rarefaction and extrapolation",
    interval: "delta method",
    source:
      "Hurlbert (1971); Colwell et al. (2012); Shen, Chao & Lin (2003); band from the unconditional variance (Colwell et al. 2012)",
  },
  {
    key: "accumulation",
    name: "Sample-based accumulation (Mao Tau) and extrapolation",
    interval: "delta method",
    source: "Colwell, Mao & Chang (2004); Colwell et al. (2012); band from the unconditional variance",
  },
  {
    key: "equalEffort",
    name: "Comparison at equal coverage",
    interval: "bootstrap",
    source: `Richness at equal sample size (Colwell et al. 2012) and equal coverage (Chao & Jost 2012); "more" or "fewer" only when the bootstrap 95% interval of the difference at equal coverage excludes 0 (${COMPARISON_BOOTSTRAP.replicates} replicates, seed ${COMPARISON_BOOTSTRAP.seed}, assemblage of Chao et al. 2014), otherwise "no clear difference"`,
  },
  {
    key: "hillCurves",
    name: "Hill numbers q = 0, 1, 2 along sample size, and sample completeness",
    interval: "bootstrap",
    source: `Size-based rarefaction and extrapolation of Hill numbers (Chao et al. 2014, Ecological Monographs 84:45–67), abundance-based when every count is of individuals, else incidence-based on complete sessions; sample coverage along size (Chao & Jost 2012, Ecology 93:2533–2547); ${HILL_RESULTS.points} sizes from 1 to twice the sample, none beyond (estimates past twice the sample are unreliable); bootstrap 95% bands from the estimated assemblage (Chao et al. 2014) with a fixed ${HILL_RESULTS.replicates} replicates and seed ${HILL_RESULTS.seed} (a fixed count chosen for speed: another seed may move a band limit by a few per cent on small samples)`,
  },
  {
    key: "hillProfile",
    name: "Asymptotic diversity profile",
    interval: "bootstrap",
    source: `Estimated Hill numbers for q from 0 to 2 (Chao et al. 2014 for q = 0, 1, 2; Chao & Jost 2015, Methods in Ecology and Evolution 6:873–882, between them); bootstrap se, ${HILL_RESULTS.replicates} replicates, seed ${HILL_RESULTS.seed}, interval estimate ± 1.96 se with its lower end raised to the observed value`,
  },
  {
    key: "similarity",
    name: "Shared species and similarity between zones",
    interval: "bootstrap",
    source: `Abundance-based (counts of individuals) or incidence-based (complete sessions) Sørensen- and Jaccard-type indices with the correction for unseen shared species (Chao, Chazdon, Colwell & Shen 2005, Ecology Letters 8:148–159), beside the classic indices; the event's rank rule applies to every zone; 95% percentile bootstrap interval of the corrected indices for each pair (${SIMILARITY_BOOTSTRAP.replicates} replicates, seed ${SIMILARITY_BOOTSTRAP.seed}; individuals redrawn from each zone's observed proportions, or complete sessions with replacement: species not yet seen are not redrawn, so the interval may be narrow)`,
  },
  {
    key: "beta",
    name: "Multiplicative beta diversity",
    interval: null,
    source:
      "Jost (2007, Ecology 88:2427–2439): gamma ÷ alpha of observed Hill numbers, zones weighted equally; on relative incidence frequencies when counts are not of individuals",
  },
] as const;

export type MethodKey = (typeof METHOD_NOTES)[number]["key"];
export type IntervalMethod = NonNullable<(typeof METHOD_NOTES)[number]["interval"]>;
