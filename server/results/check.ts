import "server-only";
import { getReport } from "@/db/queries/reports";
import { canonicalJson, computeResults, type Results } from "@/lib/results/compute";
import { inputFromRecords, inputHash, type InputRecord } from "@/lib/results/records";

/** Re-computes a report from its recorded inputs alone and compares every number. */
export async function checkReport(
  eventId: string,
  version: number,
): Promise<{ same: boolean; hashSame: boolean; recomputed: Results } | null> {
  const report = await getReport(eventId, version, { withInputs: true });
  return report ? recheckReport(report) : null;
}

/** The check of checkReport on a report already read (its results, input hash and input records). */
export function recheckReport(report: { results: Results; inputHash: string; inputRecords: readonly InputRecord[] }): {
  same: boolean;
  hashSame: boolean;
  recomputed: Results;
} {
  const zones = report.results.zones.map((z) => ({ id: z.id, name: z.name, habitat: z.habitat }));
  const meta = new Map(
    report.results.species.map((s) => [
      s.id,
      {
        id: s.id,
        scientificName: s.scientificName,
        rank: s.rank,
        group: s.group,
        sensitivity: s.sensitivity,
        names: s.names,
        countUnit: s.countUnit,
      },
    ]),
  );
  // The pending numbers are a fact declared at publishing, not computed from the inputs.
  const recomputed = computeResults({
    ...inputFromRecords(report.inputRecords, zones, meta),
    pending: report.results.pending ?? undefined,
  });
  return {
    same: canonicalJson(JSON.parse(canonicalJson(recomputed))) === canonicalJson(report.results),
    hashSame: inputHash(report.inputRecords) === report.inputHash,
    recomputed,
  };
}
