// Creates, migrates and fills the data-scale database (DATABASE_URL, e.g. emfolio_scale): the demo
// scenario, then 1 000 000 captures on 10 000 units by set-based SQL (bulk.sql). A database that
// carries the scale_seed_marker table is reused unless --reseed is given.
//   tsx --import ./scripts/support/server-only-hook.mjs scripts/bench/data-scale/seed.ts [--reseed] [--units N] [--captures-per-unit M]
import { readFile } from "node:fs/promises";
import pg from "pg";
import { closeDb } from "@/db/queries/connection";
import { runMigrations } from "@/db/queries/migrate";
import { insertDemoScenario } from "@/db/queries/seed";
import { backfillPlanStandings } from "@/db/queries/unit-plan";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { hashPassword } from "@/lib/auth/password";
import { getEnv } from "@/lib/server/env";
import { templateAnalysis } from "./template";

const target = new URL(getEnv().DATABASE_URL);
const dbName = target.pathname.slice(1);
if (!/^emfolio_scale\w*$/.test(dbName)) throw new Error(`refusing to seed ${dbName}: the data-scale database is named emfolio_scale*`);
const reseed = process.argv.includes("--reseed");
const count = (name: string, fallback: number) => {
  const i = process.argv.indexOf(name);
  const n = i >= 0 ? Number(process.argv[i + 1]) : fallback;
  if (!Number.isInteger(n) || n < 1) throw new Error(`${name} takes a whole number`);
  return n;
};
// A smaller database (e.g. --units 200 --captures-per-unit 10 into emfolio_scale_small) checks the seed quickly.
const UNITS = count("--units", 10_000);
const PER_UNIT = count("--captures-per-unit", 100);

async function withClient<T>(url: URL, run: (c: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    return await run(client);
  } finally {
    await client.end();
  }
}

async function alreadySeeded(): Promise<number | null> {
  const admin = new URL(target); admin.pathname = "/postgres";
  const exists = await withClient(admin, (c) => c.query("select 1 from pg_database where datname = $1", [dbName]));
  if (exists.rowCount === 0) return null;
  return withClient(target, async (c) => {
    const marker = await c.query("select to_regclass('public.scale_seed_marker') as t");
    if (!marker.rows[0]?.t) return null;
    const row = await c.query<{ captures: string }>("select captures from scale_seed_marker limit 1");
    return row.rows[0] ? Number(row.rows[0].captures) : null;
  });
}

async function recreate(): Promise<void> {
  const admin = new URL(target); admin.pathname = "/postgres";
  await withClient(admin, async (c) => {
    await c.query(`drop database if exists "${dbName}"`);
    await c.query(`create database "${dbName}"`);
  });
}

const BULK_TABLES = ["units", "captures", "analyses", "analysis_figures", "unit_events", "signatures", "reports"];

async function bulk(): Promise<void> {
  const t = templateAnalysis();
  const statements = (await readFile(new URL("./bulk.sql", import.meta.url), "utf8"))
    .replaceAll("{{UNITS}}", String(UNITS)).replaceAll("{{PER_UNIT}}", String(PER_UNIT))
    .split(/;\s*\n/).map((s) => s.replace(/^\s*--.*$/gm, "").trim()).filter((s) => s.length > 0);
  await withClient(target, async (c) => {
    await c.query("begin");
    await c.query("set local synchronous_commit = off; set local work_mem = '256MB'; set local maintenance_work_mem = '1GB'");
    await c.query("create table scale_template (report jsonb, preview jsonb, spectrum jsonb, figures jsonb, analysis_version text)");
    await c.query("insert into scale_template values ($1, $2, $3, $4, $5)", [
      JSON.stringify(t.report), JSON.stringify(t.preview), JSON.stringify(t.spectrum), JSON.stringify(t.figures), t.analysisVersion,
    ]);
    // Row-by-row foreign-key checks cost more than the inserts themselves (30 min for the analyses):
    // the bulk tables' foreign keys are dropped here and added again after, each checked in one pass.
    const keys = await c.query<{ tbl: string; name: string; def: string }>(
      `select conrelid::regclass::text as tbl, conname as name, pg_get_constraintdef(oid) as def from pg_constraint
       where contype = 'f' and conrelid::regclass::text = any($1)`, [BULK_TABLES]);
    for (const k of keys.rows) await c.query(`alter table ${k.tbl} drop constraint "${k.name}"`);
    for (const s of statements) {
      const started = performance.now();
      const result = await c.query(s);
      const first = s.split("\n")[0] ?? s;
      console.log(`  ${((performance.now() - started) / 1000).toFixed(1).padStart(7)} s  ${String(result.rowCount ?? "").padStart(9)}  ${first.slice(0, 90)}`);
    }
    const checked = performance.now();
    for (const k of keys.rows) await c.query(`alter table ${k.tbl} add constraint "${k.name}" ${k.def}`);
    console.log(`  ${((performance.now() - checked) / 1000).toFixed(1).padStart(7)} s  ${keys.rows.length} foreign keys added back and checked`);
    await c.query("commit");
    const started = performance.now();
    // The visibility map (index-only scans) and planner statistics; the reports' TOAST (about 8 GB)
    // has nothing to vacuum after a bulk insert and would take minutes to scan.
    await c.query("vacuum (analyze, process_toast false)");
    console.log(`  ${((performance.now() - started) / 1000).toFixed(1).padStart(7)} s  vacuum (analyze, process_toast false)`);
  });
}

/** The plan standing of the open units, as scripts/migrate.ts stores it (the seed writes plan states only). */
async function fillStandings(): Promise<void> {
  const started = performance.now();
  const n = await backfillPlanStandings();
  console.log(`  ${((performance.now() - started) / 1000).toFixed(1).padStart(7)} s  ${String(n).padStart(9)}  plan standing of the open units`);
}

try {
  const seeded = reseed ? null : await alreadySeeded();
  if (seeded !== null) {
    // Migrations added since the seed (new indexes) are applied to the database that is reused.
    await runMigrations();
    console.log(`data-scale: reusing ${dbName} (${seeded} captures; --reseed to build it again); migrations applied`);
    await fillStandings();
    // A migration that rewrote rows leaves pages not all-visible, and index-only scans then read the
    // table; vacuum skips the pages that already are, so this is quick when nothing changed.
    const started = performance.now();
    await withClient(target, (c) => c.query("vacuum (analyze, process_toast false)"));
    console.log(`  ${((performance.now() - started) / 1000).toFixed(1).padStart(7)} s  vacuum (analyze, process_toast false)`);
  } else {
    const started = performance.now();
    await recreate();
    await runMigrations();
    await insertDemoScenario(await hashPassword(DEMO_PASSWORD));
    await closeDb();
    await bulk();
    await fillStandings();
    console.log(`data-scale: seeded ${dbName} in ${((performance.now() - started) / 1000).toFixed(0)} s`);
  }
} catch (err) {
  console.error(`data-scale seeding failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeDb();
}
