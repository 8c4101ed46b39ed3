// npm run bench: runs every benchmark part (each also runnable alone), prints one table
// and writes it to BENCHMARKS.md with the machine's CPU count and the date. Figures, not
// pass/fail tests: where a figure misses its target, BENCHMARKS.md says why.
//   npx tsx scripts/bench.mts [part ...]     parts: diversity, results, publish, queue, ingest, lighthouse, scale
import { spawnSync } from "node:child_process";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { cpus } from "node:os";
import type { BenchRow } from "./bench-report";

const PARTS: { name: string; script: string; args: string[] }[] = [
  { name: "diversity", script: "scripts/bench-diversity.mts", args: ["--skip-specaccum", "--runs=5"] },
  { name: "results", script: "scripts/bench-results.mts", args: [] },
  { name: "publish", script: "scripts/bench-publish.mts", args: [] },
  { name: "queue", script: "scripts/bench-review-queue.mts", args: [] },
  { name: "ingest", script: "scripts/bench-ingest.mts", args: [] },
  { name: "lighthouse", script: "scripts/bench-lighthouse.mts", args: [] },
  // Builds its ten-event database once (about 35 minutes here), then reuses it.
  { name: "scale", script: "scripts/bench-scale.mts", args: ["--publish", "--runs=3"] },
];

const wanted = process.argv.slice(2);
const rows: BenchRow[] = [];
for (const part of PARTS.filter((p) => !wanted.length || wanted.includes(p.name))) {
  if (!existsSync(part.script)) {
    rows.push({ part: part.name, figure: "(part not present in this checkout)", value: "–" });
    continue;
  }
  console.log(`\n=== ${part.name}: npx tsx ${part.script} ${part.args.join(" ")}`);
  const started = Date.now();
  const r = spawnSync("npx", ["tsx", part.script, ...part.args], {
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
    maxBuffer: 64 * 1024 * 1024,
  });
  process.stdout.write(
    r.stdout
      .split("\n")
      .filter((l) => !l.startsWith("BENCH "))
      .join("\n"),
  );
  const line = r.stdout
    .split("\n")
    .reverse()
    .find((l) => l.startsWith("BENCH "));
  if (r.status !== 0 || !line) {
    rows.push({
      part: part.name,
      figure: "run failed",
      value: `exit ${r.status}`,
      note: `after ${Math.round((Date.now() - started) / 1000)} s; see the output above`,
    });
    continue;
  }
  rows.push(...(JSON.parse(line.slice(6)) as BenchRow[]));
}

const machine = `${cpus().length} CPU cores (${cpus()[0]?.model.trim() ?? "unknown"}), Node.js ${process.version}`;
const date = new Date().toISOString().slice(0, 10);
const table = [
  "| part | figure | value | target | met |",
  "| --- | --- | --- | --- | --- |",
  ...rows.map(
    (r) =>
      `| ${r.part} | ${r.figure}${r.note ? ` (${r.note})` : ""} | ${r.value} | ${r.target ?? ""} | ${r.met === undefined ? "" : r.met ? "yes" : "**no**"} |`,
  ),
].join("\n");
console.log(`\n${table}\n`);

const notesFile = "scripts/bench-notes.md";
const notes = existsSync(notesFile) ? readFileSync(notesFile, "utf8") : "";
writeFileSync(
  "BENCHMARKS.md",
  `# Benchmarks\n\nMeasured on ${date} on ${machine}, by \`npm run bench\` (each part also runs alone: see scripts/bench.mts).\n\n${table}\n\n${notes}`,
);
console.log("written to BENCHMARKS.md");
