// Creates, migrates and fills the data-scale database (DATABASE_URL, e.g. emfolio_scale): the demo
// scenario, then 1 000 000 captures on 10 000 units by set-based SQL (bulk.sql). A database that
// carries the scale_seed_marker table is reused unless --reseed is given.
//   tsx --import ./scripts/support/server-only-hook.mjs scripts/bench/data-scale/seed.ts [--reseed]
import { readFile } from "node:fs/promises";
import pg from "pg";
import { closeDb } from "@/db/queries/connection";
import { runMigrations } from "@/db/queries/migrate";
import { insertDemoScenario } from "@/db/queries/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { hashPassword } from "@/lib/auth/password";
import { getEnv } from "@/lib/server/env";
import { templateAnalysis } from "./template";

const target = new URL(getEnv().DATABASE_URL);
const dbName = target.pathname.slice(1);
if (!/^emfolio_scale\w*$/.test(dbName)) throw new Error(`refusing to seed ${dbName}: the data-scale database is named emfolio_scale*`);
const reseed = process.argv.includes("--reseed");

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

async function bulk(): Promise<void> {
  const t = templateAnalysis();
  const statements = (await readFile(new URL("./bulk.sql", import.meta.url), "utf8"))
    .split(/;\s*\n/).map((s) => s.replace(/^\s*--.*$/gm, "").trim()).filter((s) => s.length > 0);
  await withClient(target, async (c) => {
    await c.query("begin");
    await c.query("set local synchronous_commit = off; set local work_mem = '256MB'; set local maintenance_work_mem = '1GB'");
    await c.query("create table scale_template (report jsonb, preview jsonb, spectrum jsonb, figures jsonb, analysis_version text)");
    await c.query("insert into scale_template values ($1, $2, $3, $4, $5)", [
      JSON.stringify(t.report), JSON.stringify(t.preview), JSON.stringify(t.spectrum), JSON.stringify(t.figures), t.analysisVersion,
    ]);
    for (const s of statements) {
      const started = performance.now();
      const result = await c.query(s);
      const first = s.split("\n")[0] ?? s;
      console.log(`  ${((performance.now() - started) / 1000).toFixed(1).padStart(7)} s  ${String(result.rowCount ?? "").padStart(9)}  ${first.slice(0, 90)}`);
    }
    await c.query("commit");
    const started = performance.now();
    await c.query("vacuum analyze");
    console.log(`  ${((performance.now() - started) / 1000).toFixed(1).padStart(7)} s  vacuum analyze`);
  });
}

try {
  const seeded = reseed ? null : await alreadySeeded();
  if (seeded !== null) {
    console.log(`data-scale: reusing ${dbName} (${seeded} captures; --reseed to build it again)`);
  } else {
    const started = performance.now();
    await recreate();
    await runMigrations();
    await insertDemoScenario(await hashPassword(DEMO_PASSWORD));
    await closeDb();
    await bulk();
    console.log(`data-scale: seeded ${dbName} in ${((performance.now() - started) / 1000).toFixed(0)} s`);
  }
} catch (err) {
  console.error(`data-scale seeding failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeDb();
}
