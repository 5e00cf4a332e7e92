// Empties the test database before a run. Refuses any database whose name does not end in _test.
import pg from "pg";
import { getEnv } from "@/lib/server/env";

const url = new URL(getEnv().DATABASE_URL);
if (!url.pathname.endsWith("_test")) {
  console.error(`refusing to reset ${url.pathname.slice(1)}: only a database named *_test is reset`);
  process.exit(1);
}
const client = new pg.Client({ connectionString: url.toString() });
await client.connect();
await client.query("drop schema if exists public cascade; drop schema if exists drizzle cascade; create schema public;");
await client.end();
console.log(`reset ${url.pathname.slice(1)}`);
