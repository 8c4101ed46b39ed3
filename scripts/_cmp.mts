import { createHash } from "node:crypto";
const { sql } = await import("drizzle-orm");
const { getDb } = await import("../db/client");
const { loadEventInputRecords } = await import("../db/queries/report-inputs");
const { loadInputRecords } = await import("../db/queries/results");
const { inReportTransaction, latestReportInputs } = await import("../db/queries/reports");
const { inputHash } = await import("../lib/results/records");
const db = getDb();
const [ev] = (await db.execute<{ id: string }>(sql`SELECT id FROM events WHERE slug = 'bench-million'`)).rows;
const id = ev!.id;
const oldHash = (rs: readonly (readonly unknown[])[]) => { const h = createHash("sha256"); for (const r of [...rs].sort((a, b) => (String(a[0]) < String(b[0]) ? -1 : 1))) h.update(`${JSON.stringify(r)}\n`); return h.digest("hex"); };
class R extends Error {}
for (let k = 0; k < 2; k++) {
  await inReportTransaction(id, async (tx) => {
    let t = performance.now();
    const a = await loadInputRecords(id, tx);
    const tOld = performance.now() - t;
    t = performance.now();
    await tx.execute(sql`CREATE TEMP TABLE old_json ON COMMIT DROP AS SELECT ${JSON.stringify(a)}::jsonb AS input_records`);
    const tOldWrite = performance.now() - t;
    t = performance.now();
    const b = await loadEventInputRecords(id, tx);
    const tNew = performance.now() - t;
    t = performance.now();
    await loadEventInputRecords(id, tx, { storeFor: crypto.randomUUID() });
    const tNewStore = performance.now() - t;
    t = performance.now();
    const h1 = oldHash(a);
    const tH1 = performance.now() - t;
    t = performance.now();
    const h2 = inputHash(b);
    const tH2 = performance.now() - t;
    t = performance.now();
    await latestReportInputs(id, tx);
    const tPrev = performance.now() - t;
    console.log(JSON.stringify({ same: h1 === h2, n: [a.length, b.length], oldRead: tOld, oldJsonWrite: tOldWrite, newRead: tNew, newReadAndStore: tNewStore, oldHash: tH1, newHash: tH2, readPrevPacked: tPrev }, (_, v) => (typeof v === "number" ? Math.round(v) : v)));
    throw new R();
  }).catch((e) => { if (!(e instanceof R)) throw e; });
}
process.exit(0);
