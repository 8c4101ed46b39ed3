// Pure computation of the results set (lib/results/compute.ts) on an input shaped like the
// 1,000,000-sighting benchmark event of bench-results.mts (300 insect taxa chosen by a cubed
// uniform, counts 1–12, 25 sightings per session, four in five sessions complete, four zones,
// 70% approved), without the database: how long computeResults takes with and without the
// Hill curves' bootstrap bands (and the zone × zone table's intervals, which come with them).
// Each call starts without the comparison replicates kept by an earlier call (lib/results/compare.ts).
//
//   npx tsx scripts/bench-results-compute.mts
import { computeResults, type ResultsInput } from "../lib/results/compute";
import { forgetBootstraps } from "../lib/results/compare";

let state = 20261203;
const rnd = () => (state = (state * 48271) % 2147483647) / 2147483647;
const zones = [1, 2, 3, 4].map((g) => ({ id: `z${g}`, name: `Zone ${g}`, habitat: g % 2 ? "interior" : "edge" }));
const taxa = Array.from({ length: 300 }, (_, i) => ({
  id: `t${i}`,
  scientificName: `Benchus species${i}`,
  rank: "species",
  group: "insects",
  sensitivity: "open" as const,
  names: {},
}));
const counts = new Map<string, number>();
const sessions: ResultsInput["sessions"] = [];
for (let s = 0; s < 40_000; s++) {
  const zoneId = zones[s % 4]!.id;
  const found = new Set<number>();
  for (let k = 0; k < 25; k++) {
    if (rnd() >= 0.7) continue;
    const t = Math.floor(300 * Math.pow(rnd(), 3));
    found.add(t);
    const key = `${zoneId}|${t}`;
    counts.set(key, (counts.get(key) ?? 0) + 1 + Math.floor(rnd() * rnd() * 12));
  }
  if (s % 5 !== 0) sessions.push({ zoneId, taxa: [...found] });
}
const input: ResultsInput = {
  zones,
  taxa,
  counts: [...counts].map(([k, individuals]) => {
    const [zoneId, t] = k.split("|");
    return { zoneId: zoneId!, taxon: Number(t), individuals };
  }),
  sessions,
};
const time = (label: string, bands: boolean) => {
  forgetBootstraps();
  const t0 = performance.now();
  const r = computeResults(input, { bands });
  const ms = performance.now() - t0;
  console.log(
    `${label}: ${ms.toFixed(0)} ms (${r.totals.individuals} individuals, ${r.totals.completeSessions} sessions)`,
  );
  return ms;
};
time("warm-up, without bands", false);
time("computeResults without Hill bands", false);
time("computeResults with Hill bands", true);
