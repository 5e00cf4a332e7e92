/**
 * The local object store (started by scripts/services.sh): s3rver on an internal loopback port
 * behind a verifying gate on the public one (scripts/services/s3/gate.ts).
 *
 *   node_modules/.bin/tsx scripts/services/s3-server.ts --port 45690 --dir .data/s3 \
 *     --secret-file .data/s3-secret --origin http://127.0.0.1:3000 [--origin ...] \
 *     [--bucket emfolio-captures ...] [--quota-bytes N] [--also-listen 10.77.0.1 ...]
 *
 * Listens on 127.0.0.1 and the --also-listen addresses (EMFOLIO_BIND_ADDRESS). Access key id `S3RVER` (the only one s3rver knows), the secret from
 * --secret-file, region us-east-1. --quota-bytes makes the store refuse (507) writes that would
 * take --dir over that many bytes, as a full disk does; tests use it.
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import type { AddressInfo } from "node:net";
import path from "node:path";
import { parseArgs } from "node:util";
import { isDiskFull } from "./s3/body";
import { createGate } from "./s3/gate";
import { alsoListen } from "./also-listen";

type S3rverInstance = { run(): Promise<AddressInfo>; close(): Promise<void> };
type S3rverClass = new (options: Record<string, unknown>) => S3rverInstance;

const { values } = parseArgs({
  options: {
    port: { type: "string" },
    dir: { type: "string", default: ".data/s3" },
    "spool-dir": { type: "string" },
    "secret-file": { type: "string" },
    "access-key-id": { type: "string", default: "S3RVER" },
    region: { type: "string", default: "us-east-1" },
    origin: { type: "string", multiple: true, default: [] },
    bucket: { type: "string", multiple: true, default: [] },
    "quota-bytes": { type: "string" },
    "also-listen": { type: "string", multiple: true, default: [] },
  },
});

function fail(message: string): never {
  console.error(`s3-server: ${message}`);
  process.exit(2);
}

const port = Number(values.port);
if (!Number.isInteger(port) || port < 0 || port > 65535) fail("--port must be a port number");
if (!values["secret-file"]) fail("--secret-file is required (the store refuses requests not signed with its secret)");
const secret = readFileSync(values["secret-file"], "utf8").trim();
if (secret.length < 16) fail(`the secret in ${values["secret-file"]} is shorter than 16 characters`);
const quota = values["quota-bytes"] === undefined ? null : Number(values["quota-bytes"]);
if (quota !== null && !(Number.isInteger(quota) && quota >= 0)) fail("--quota-bytes must be a whole number of bytes");
const dataDir = path.resolve(values.dir);
const log = (line: string) => console.log(`${new Date().toISOString()} ${line}`);

// A write failure on a full disk inside the store must not end the process: log and carry on.
process.on("uncaughtException", (err) => {
  if (isDiskFull(err)) log(`disk full: ${err.message}`);
  else {
    console.error(err);
    process.exit(1);
  }
});

const S3rver = createRequire(import.meta.url)("s3rver") as S3rverClass;
const backend = new S3rver({
  address: "127.0.0.1", port: 0, directory: dataDir, silent: true,
  configureBuckets: values.bucket.map((name) => ({ name, configs: [] })),
});
const inner = await backend.run();
const gate = createGate({
  credentials: { accessKeyId: values["access-key-id"], secretAccessKey: secret, region: values.region },
  backend: { host: "127.0.0.1", port: inner.port },
  dataDir, spoolDir: path.resolve(values["spool-dir"] ?? `${dataDir}.spool`),
  origins: new Set(values.origin), quotaBytes: quota, log,
});
gate.listen(port, "127.0.0.1", () => {
  const address = gate.address() as AddressInfo;
  log(`emfolio object store listening on 127.0.0.1:${address.port} (store ${dataDir}, CORS for ${values.origin.join(" ") || "no origin"}${quota === null ? "" : `, quota ${quota} bytes`})`);
  alsoListen(gate, values["also-listen"], address.port, log);
});
for (const signal of ["SIGTERM", "SIGINT"] as const) {
  process.on(signal, () => {
    gate.close();
    void backend.close().finally(() => process.exit(0));
  });
}
