import { execFileSync } from "node:child_process";
import { mkdtempSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { Client } from "pg";
import { describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seed/demo";
import { db } from "./helpers";

// The backup path of README.md / DEVELOPERS.md, exercised once: pg_dump of the test
// database, pg_restore into a new one, and the same records and guarantees come back.
const BIN = "/usr/lib/postgresql/15/bin";

describe("backup and restore with pg_dump / pg_restore", () => {
  it("restores every record, and the restored copy still refuses edits to review history", async () => {
    await seedDemo(db() as never);
    const source = new URL(process.env.DATABASE_URL!);
    const target = new URL(source.toString());
    target.pathname = `${source.pathname}_restore`;
    const dump = path.join(mkdtempSync(path.join(tmpdir(), "ecotone-backup-")), "ecotone.dump");
    const conn = ["-h", source.hostname, "-p", source.port, "-U", "postgres"];

    execFileSync(`${BIN}/pg_dump`, [...conn, "-Fc", "-f", dump, source.pathname.slice(1)]);
    expect(statSync(dump).size).toBeGreaterThan(10_000);
    execFileSync(`${BIN}/dropdb`, [...conn, "--if-exists", "--force", target.pathname.slice(1)]);
    execFileSync(`${BIN}/createdb`, [...conn, "-O", "ecotone", target.pathname.slice(1)]);
    // PostGIS is created by the superuser (as on set-up); the rest is restored as the app's role.
    execFileSync(`${BIN}/psql`, [...conn, "-d", target.pathname.slice(1), "-c", "CREATE EXTENSION postgis"]);
    // PostGIS's own objects (the extension, its spatial_ref_sys rows) come with CREATE EXTENSION.
    const list = execFileSync(`${BIN}/pg_restore`, ["-l", dump], { encoding: "utf8" })
      .split("\n")
      .filter((l) => !/EXTENSION|spatial_ref_sys/.test(l))
      .join("\n");
    const listFile = `${dump}.list`;
    writeFileSync(listFile, list);
    execFileSync(`${BIN}/pg_restore`, [
      ...conn,
      "-d",
      target.pathname.slice(1),
      "--no-owner",
      "--role=ecotone",
      "--exit-on-error",
      "-L",
      listFile,
      dump,
    ]);

    const counts = async (url: string) => {
      const c = new Client({ connectionString: url });
      await c.connect();
      try {
        const { rows } =
          await c.query(`SELECT (SELECT count(*) FROM sightings)::int AS sightings, (SELECT count(*) FROM reviews)::int AS reviews,
          (SELECT count(*) FROM zones)::int AS zones, (SELECT md5(string_agg(id::text || review_state || ST_AsText(location), ',' ORDER BY id)) FROM sightings) AS fingerprint`);
        return rows[0];
      } finally {
        await c.end();
      }
    };
    const before = await counts(source.toString());
    const after = await counts(target.toString());
    expect(after).toEqual(before);
    expect(before.sightings).toBeGreaterThan(200);

    const c = new Client({ connectionString: target.toString() });
    await c.connect();
    try {
      await expect(c.query("UPDATE reviews SET reason = 'changed'")).rejects.toThrow(/append-only/);
    } finally {
      await c.end();
    }
    execFileSync(`${BIN}/dropdb`, [...conn, "--force", target.pathname.slice(1)]);
  });
});
