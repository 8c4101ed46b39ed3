// Each number's published method name and source; the one-line note on how to read it is
// translated (messages: Results.notes.<key>). Frozen into every report as its method notes.
export const METHOD_NOTES = [
  { key: "observed", name: "Observed richness (S_obs)", source: "count of species with at least one approved record" },
  { key: "individuals", name: "Individuals (n)", source: "sum of approved counts" },
  {
    key: "chao1",
    name: "Chao1",
    source: "Chao (1984); bias-corrected form as vegan estimateR; log-normal interval, Chao (1987)",
  },
  { key: "ace", name: "ACE", source: "Chao & Lee (1992), rare = 10 or fewer individuals" },
  { key: "chao2", name: "Chao2", source: "Chao (1987); complete count sessions as sampling units, as vegan specpool" },
  { key: "ice", name: "ICE", source: "Lee & Chao (1994), infrequent = 10 or fewer sessions" },
  { key: "jack1", name: "First-order jackknife", source: "Burnham & Overton (1978); se Heltshe & Forrester (1983)" },
  { key: "jack2", name: "Second-order jackknife", source: "Burnham & Overton (1978)" },
  { key: "coverage", name: "Sample coverage", source: "Chao & Jost (2012)" },
  { key: "hill0", name: "Hill number q = 0", source: "Hill (1973); estimate Chao et al. (2014)" },
  {
    key: "hill1",
    name: "Hill number q = 1",
    source: "Hill (1973); estimate Chao, Wang & Jost (2013); bootstrap interval, Chao et al. (2014)",
  },
  { key: "hill2", name: "Hill number q = 2", source: "Hill (1973); estimate Chao et al. (2014); bootstrap interval" },
  { key: "shannon", name: "Shannon index H′", source: "Shannon (1948), natural logarithm" },
  { key: "simpson", name: "Simpson index (1 − D)", source: "Simpson (1949), Gini–Simpson form" },
  { key: "evenness", name: "Pielou evenness J′", source: "Pielou (1966)" },
  {
    key: "rarefaction",
    name: "Individual-based rarefaction and extrapolation",
    source: "Hurlbert (1971); Colwell et al. (2012); Shen, Chao & Lin (2003)",
  },
  {
    key: "accumulation",
    name: "Sample-based accumulation (Mao Tau) and extrapolation",
    source: "Colwell, Mao & Chang (2004); Colwell et al. (2012)",
  },
  {
    key: "equalEffort",
    name: "Comparison at equal sample size and equal coverage",
    source: "Colwell et al. (2012); Chao & Jost (2012)",
  },
] as const;

export type MethodKey = (typeof METHOD_NOTES)[number]["key"];
