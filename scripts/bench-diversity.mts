// Benchmark of lib/diversity on a synthetic event: 1,000,000 individuals of 2,000 species
// in 5,000 sampling units, from a seeded PRNG. Times the whole results set and, where R
// and vegan are installed, vegan's equivalents on the same data in the same run.
//
//   npx tsx scripts/bench-diversity.mts [--no-vegan] [--skip-specaccum] [--vegan-timeout=SECONDS] [--runs=N]
//
// vegan's specaccum(method = "exact") takes about 5 minutes on this event (2,000 × 2,000
// correlations, then one outer product per unit); --skip-specaccum leaves it out.

import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { accumulation, diversityResults, rarefaction } from "../lib/diversity/index";
import { Rng } from "../lib/diversity/random";
import { accumulateData } from "../lib/diversity/curves";
import { incidenceData } from "../lib/diversity/incidence";
import { reportRows, type BenchRow } from "./bench-report";

const SPECIES = 2000;
const UNITS = 5000;
const INDIVIDUALS = 1_000_000;
const CURVE_POINTS = 100;
const SEED = 20240601;

const args = process.argv.slice(2);
const withVegan = !args.includes("--no-vegan");
const skipSpecaccum = args.includes("--skip-specaccum");
const veganTimeout = Number(args.find((a) => a.startsWith("--vegan-timeout="))?.split("=")[1] ?? 1800);
const runs = Number(args.find((a) => a.startsWith("--runs="))?.split("=")[1] ?? 5);

/** Synthetic event: log-normal abundances; each species clumped in a run of units. */
function syntheticEvent(): { units: number[][]; counts: number[] } {
  const rng = new Rng(SEED);
  const weights = Array.from({ length: SPECIES }, () => {
    const z = Math.sqrt(-2 * Math.log(1 - rng.next())) * Math.cos(2 * Math.PI * rng.next()); // Box & Muller (1958)
    return Math.exp(2 * z);
  });
  const total = weights.reduce((a, b) => a + b, 0);
  // Walker's alias table for drawing a species per individual (Vose 1991).
  const prob = new Float64Array(SPECIES);
  const alias = new Int32Array(SPECIES);
  const scaled = weights.map((w) => (w / total) * SPECIES);
  const small: number[] = [];
  const large: number[] = [];
  scaled.forEach((p, i) => (p < 1 ? small : large).push(i));
  while (small.length && large.length) {
    const s = small.pop() as number;
    const l = large.pop() as number;
    prob[s] = scaled[s] as number;
    alias[s] = l;
    scaled[l] = (scaled[l] as number) + (scaled[s] as number) - 1;
    ((scaled[l] as number) < 1 ? small : large).push(l);
  }
  for (const i of [...small, ...large]) prob[i] = 1;
  const home = Array.from({ length: SPECIES }, () => rng.below(UNITS));
  const range = Array.from({ length: SPECIES }, () => 20 + Math.floor(UNITS * rng.next() ** 2));
  const units = Array.from({ length: UNITS }, () => new Array<number>(SPECIES).fill(0));
  const counts = new Array<number>(SPECIES).fill(0);
  for (let i = 0; i < INDIVIDUALS; i++) {
    const k = rng.below(SPECIES);
    const s = rng.next() < (prob[k] as number) ? k : (alias[k] as number);
    const t = ((home[s] as number) + rng.below(range[s] as number)) % UNITS;
    (units[t] as number[])[s] = ((units[t] as number[])[s] as number) + 1;
    counts[s] = (counts[s] as number) + 1;
  }
  return { units, counts };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] as number;
}

function time<T>(fn: () => T): [T, number] {
  const t0 = performance.now();
  const out = fn();
  return [out, performance.now() - t0];
}

const fmt = (ms: number): string => (ms >= 10_000 ? `${(ms / 1000).toFixed(1)} s` : `${ms.toFixed(1)} ms`);

const [{ units, counts }, genMs] = time(syntheticEvent);
const observed = counts.filter((c) => c > 0).length;
let nnz = 0;
for (const row of units) for (const v of row) if (v > 0) nnz++;
const distinct = new Set(counts.filter((c) => c > 0)).size;
console.log(`synthetic event (seed ${SEED}) built in ${fmt(genMs)}`);
console.log(
  `  ${INDIVIDUALS.toLocaleString("en")} individuals, ${observed} of ${SPECIES} species seen, ${UNITS} units, ` +
    `${nnz.toLocaleString("en")} unit×species detections, ${distinct} distinct counts, ` +
    `f1 = ${counts.filter((c) => c === 1).length}, f2 = ${counts.filter((c) => c === 2).length}`,
);

// Whole results set: all estimators (incl. the 200-replicate Hill bootstrap), 100-point
// rarefaction/extrapolation and accumulation/extrapolation curves with bands, coverage
// and vegan-style conditional se.
const input = { counts, units, curvePoints: CURVE_POINTS };
const [first, coldMs] = time(() => diversityResults(input));
const warm: number[] = [];
for (let i = 0; i < runs; i++) warm.push(time(() => diversityResults(input))[1]);
const oursMs = median(warm);
console.log(`\nours: diversityResults (all estimators, ${CURVE_POINTS}-point curves with extrapolation)`);
console.log(
  `  first run ${fmt(coldMs)}; median of ${runs} further runs ${fmt(oursMs)} (min ${fmt(Math.min(...warm))})`,
);
console.log(`  under 500 ms: ${oursMs < 500 ? "yes" : "NO"}`);

const raresizes = first.rarefactionCurve.filter((p) => p.kind === "rarefied").map((p) => p.size);
const [, rareMs] = time(() => rarefaction(counts, raresizes));
const [, accAllMs] = time(() => accumulation(units));
console.log(
  `  matched pieces: rarefaction at the ${raresizes.length} rarefied sizes with se ${fmt(rareMs)}; accumulation at all ${UNITS} units with sd ${fmt(accAllMs)}`,
);
// The same accumulation with vegan's conditional sd summed over every unit's detections
// (the path before species pairs were grouped by frequency class); same numbers.
const incData = incidenceData(units);
const allUnits = Array.from({ length: UNITS }, (_, i) => i + 1);
const [, accPairsMs] = time(() => accumulateData(incData, allUnits, "auto"));
const [, accSlowMs] = time(() => accumulateData(incData, allUnits, "detections"));
console.log(
  `  accumulation sd at all ${UNITS} units (matrix already read): class-pair sums ${fmt(accPairsMs)}; per-detection sums ${fmt(accSlowMs)}`,
);

const rows: BenchRow[] = [
  {
    part: "diversity engine",
    figure: `whole results set, ${INDIVIDUALS.toLocaleString("en")} individuals / ${SPECIES} species / ${UNITS} units`,
    value: fmt(oursMs),
    target: "< 500 ms",
    met: oursMs < 500,
  },
  {
    part: "diversity engine",
    figure: `accumulation (exact, vegan conditional sd) at all ${UNITS} units`,
    value: fmt(accAllMs),
    target: "< 1 s",
    met: accAllMs < 1000,
    note: `per-detection path ${fmt(accSlowMs)}`,
  },
];
process.on("exit", () => reportRows(rows));

if (!withVegan) process.exit(0);
const probe = spawnSync(
  "Rscript",
  ["-e", "suppressMessages(library(vegan)); cat(as.character(packageVersion('vegan')))"],
  { encoding: "utf8" },
);
if (probe.status !== 0) {
  console.log(
    "\nvegan: Rscript or vegan not installed, comparison skipped (Debian: apt-get install r-base-core r-cran-vegan)",
  );
  process.exit(0);
}

const dir = mkdtempSync(join(tmpdir(), "bench-diversity-"));
try {
  const flat = new Int32Array(UNITS * SPECIES);
  units.forEach((row, t) => row.forEach((v, s) => (flat[t * SPECIES + s] = v)));
  writeFileSync(join(dir, "units.bin"), Buffer.from(flat.buffer));
  writeFileSync(join(dir, "sizes.txt"), raresizes.join("\n"));
  writeFileSync(
    join(dir, "bench.R"),
    `suppressMessages(library(vegan))
x <- matrix(readBin("${join(dir, "units.bin")}", "integer", n = ${UNITS * SPECIES}, size = 4, endian = "little"),
            nrow = ${UNITS}, ncol = ${SPECIES}, byrow = TRUE)
counts <- colSums(x)
sizes <- scan("${join(dir, "sizes.txt")}", quiet = TRUE)
el <- function(e) system.time(e)[["elapsed"]] * 1000
t <- c(
  estimateR = el(estimateR(counts)),
  diversity = el({ diversity(counts); diversity(counts, "simpson"); diversity(counts, "invsimpson"); renyi(counts, scales = c(0, 1, 2), hill = TRUE) }),
  specpool = el(specpool(x)),
  rarefy = el(suppressWarnings(rarefy(counts, sizes, se = TRUE))),
  specaccum = ${skipSpecaccum ? "NA" : 'el(specaccum(x, method = "exact"))'}
)
t <- t[!is.na(t)]
cat(paste(names(t), t, sep = "=", collapse = " "), "\\n")
`,
  );
  console.log(
    `\nvegan ${probe.stdout.trim()}: estimateR, diversity/renyi, specpool, rarefy(se = TRUE) at the same ${raresizes.length} sizes,`,
  );
  console.log(
    skipSpecaccum
      ? "  (specaccum skipped: the ratio below leaves vegan's slowest step out)"
      : `  specaccum(method = "exact") (vegan computes all ${UNITS} points; no way to ask for fewer). This takes minutes…`,
  );
  const r = spawnSync("Rscript", [join(dir, "bench.R")], { encoding: "utf8", timeout: veganTimeout * 1000 });
  const line = r.stdout.trim().split("\n").pop() ?? "";
  if (r.status !== 0 || !line.includes("rarefy=")) {
    console.log(`  vegan run failed or timed out after ${veganTimeout} s: ${r.stderr.slice(-500)}`);
    process.exit(0);
  }
  const vt = Object.fromEntries(
    line
      .split(" ")
      .map((kv) => kv.split("="))
      .map(([k, v]) => [k, Number(v)]),
  ) as Record<string, number>;
  const veganTotal = Object.values(vt).reduce((a, b) => a + b, 0);
  for (const [k, v] of Object.entries(vt)) console.log(`  ${k.padEnd(10)} ${fmt(v)}`);
  console.log(`  total      ${fmt(veganTotal)}`);
  console.log(`\nratio vegan / ours (whole results set): ${(veganTotal / oursMs).toFixed(0)}×`);
  rows.push({
    part: "diversity engine",
    figure: `R vegan ${probe.stdout.trim()} on the same data${skipSpecaccum ? " (without specaccum)" : ""}`,
    value: fmt(veganTotal),
    target: "ours ≥ 5× faster",
    met: veganTotal / oursMs >= 5,
    note: `ratio ${(veganTotal / oursMs).toFixed(0)}×`,
  });
  console.log(
    `  rarefy at the same sizes: vegan ${fmt(vt.rarefy ?? NaN)} vs ours ${fmt(rareMs)} (${((vt.rarefy ?? NaN) / rareMs).toFixed(0)}×)`,
  );
  if (vt.specaccum !== undefined) {
    console.log(
      `  exact accumulation at all ${UNITS} units: vegan ${fmt(vt.specaccum)} vs ours ${fmt(accAllMs)} (${(vt.specaccum / accAllMs).toFixed(0)}×)`,
    );
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
