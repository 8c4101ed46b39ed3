import { execFileSync } from "node:child_process";
import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { Client } from "pg";

// A streaming replica of the test cluster on loopback, with PostgreSQL's own tools (Debian's
// PostgreSQL 15): pg_basebackup -R writes standby.signal and primary_conninfo, then pg_ctl
// starts it as a hot standby. initdb's default pg_hba.conf already trusts replication from
// 127.0.0.1 (scripts/pg.sh creates the cluster with --auth=trust). As root, the tools run as
// the "postgres" system user, as scripts/pg.sh does.
const PG_BIN = "/usr/lib/postgresql/15/bin";

function asPostgres(command: string, args: string[]): void {
  const root = process.getuid?.() === 0;
  execFileSync(root ? "runuser" : command, root ? ["-u", "postgres", "--", command, ...args] : args, {
    stdio: ["ignore", "ignore", "pipe"],
  });
}

export type Replica = {
  /** The app's URL (same user and database as the primary's), on the replica's port. */
  url: string;
  /** The superuser on the replica, for pausing and resuming replay. */
  admin: () => Promise<Client>;
  stop: () => Promise<void>;
};

export async function startReplica(primaryUrl: string, port: number): Promise<Replica> {
  const primary = new URL(primaryUrl);
  const dir = path.resolve(".data", `replica-test-${port}`);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true, mode: 0o700 });
  if (process.getuid?.() === 0) execFileSync("chown", ["postgres:postgres", dir]);
  asPostgres(`${PG_BIN}/pg_basebackup`, [
    "-h",
    primary.hostname,
    "-p",
    primary.port || "5432",
    "-U",
    "postgres",
    "-D",
    dir,
    "-R",
    "-X",
    "stream",
    "-c",
    "fast",
    "--no-sync", // a throw-away copy: no need to wait for the disk
  ]);
  const ctl = (args: string[]) => asPostgres(`${PG_BIN}/pg_ctl`, ["-D", dir, ...args]);
  ctl([
    "-l",
    path.join(dir, "replica.log"),
    "-w",
    "-t",
    "60",
    "-o",
    // A hot standby needs at least the primary's max_connections (scripts/pg.sh sets 200).
    `-c listen_addresses=127.0.0.1 -p ${port} -c unix_socket_directories='' -c hot_standby=on -c max_connections=200 -c recovery_init_sync_method=syncfs -c fsync=off`,
    "start",
  ]);
  const url = new URL(primaryUrl);
  url.port = String(port);
  const admin = async () => {
    const u = new URL(url);
    u.username = "postgres";
    u.password = "";
    const c = new Client({ connectionString: u.toString() });
    await c.connect();
    return c;
  };
  return {
    url: url.toString(),
    admin,
    stop: async () => {
      ctl(["-m", "fast", "-w", "stop"]);
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
