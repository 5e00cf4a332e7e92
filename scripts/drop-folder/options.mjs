// Command line, help text and the station key of the drop-folder uploader.
import { readFileSync, statSync } from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";

export const TEST_KINDS = ["no-load", "load", "back-emf", "other"];
/** e.g. KG45-260301_no-load_1500rpm.csv or KG45-260301_back-emf_3000rpm_run2.csv */
export const DEFAULT_PATTERN = "^(?<serial>[A-Za-z0-9./-]+?)_(?<kind>no-load|load|back-emf|other)_(?<rpm>\\d+(?:\\.\\d+)?)rpm(?:[_.-].*)?\\.(?:csv|txt|tsv)$";
export const KEY_VARIABLE = "EMFOLIO_STATION_KEY";

export const HELP = `Emfolio drop folder: uploads each capture saved into a folder to Emfolio's bench API.

Usage: npm run drop-folder -- --folder <dir> --server <url> [options]

  --folder <dir>         folder the bench software saves captures (.csv, .txt, .tsv) into
  --server <url>         Emfolio's address                    e.g. --server https://emfolio.lab.example
  --key-file <path>      file holding the station key, readable by its owner only (chmod 600);
                         else the key is read from the ${KEY_VARIABLE} environment variable.
                         The key is never taken from the command line.
  --name-pattern <re>    regular expression on the file name with named groups serial, kind, rpm
                         (default: <serial>_<test kind>_<speed>rpm[_anything].csv)
  --test-kind <kind>     test kind when the name and sidecar give none: ${TEST_KINDS.join(", ")}
  --settle <s>           seconds a file must stay unchanged before it is sent [s], default 5
  --poll <s>             seconds between looks at the folder [s], default 2
  --limit-kib-s <n>      upload bandwidth limit [KiB/s], default 0 (none)
  --max-attempts <n>     with --once: failed attempts before a file is left for the next run, default 8
  --log <file>           log file, default <folder>/drop-folder.log
  --state <file>         state file (what was sent, uploads in progress), default <folder>/.drop-folder-state.json
  --once                 send what is in the folder now, then exit (0: all sent or refused, 1: some left)
  -h, --help             print this help

A JSON file beside a capture (capture.csv.json or capture.json) overrides the name pattern:
  {"unitSerial": "KG45-260301", "testKind": "no-load", "speedRpm": 1500,
   "channelRoles": {"V_AB (V)": "vab"}, "probeScales": {"V_AB (V)": 100}, "notes": "after rewind"}
Sent files move to <folder>/sent, refused ones to <folder>/refused with <name>.reason.txt beside them.`;

export class UsageError extends Error {}

const OPTIONS = {
  folder: { type: "string" }, server: { type: "string" }, "key-file": { type: "string" }, "name-pattern": { type: "string" },
  "test-kind": { type: "string" }, settle: { type: "string" }, poll: { type: "string" }, "limit-kib-s": { type: "string" },
  "max-attempts": { type: "string" }, log: { type: "string" }, state: { type: "string" }, once: { type: "boolean" },
  help: { type: "boolean", short: "h" },
};

function number(values, name, fallback, min) {
  const text = values[name];
  if (text === undefined) return fallback;
  const value = Number(text);
  if (!Number.isFinite(value) || value < min) throw new UsageError(`--${name} needs a number of at least ${min}, got ${text}`);
  return value;
}

export function parseOptions(argv) {
  let parsed;
  try {
    parsed = parseArgs({ args: argv, options: OPTIONS, allowPositionals: false, strict: true });
  } catch (error) {
    throw new UsageError(`${String(error.message).split(". To specify")[0]} (see --help)`);
  }
  const values = parsed.values;
  if (values.help) return { help: true };
  if (!values.folder) throw new UsageError("Give --folder <dir> (see --help)");
  if (!values.server) throw new UsageError("Give --server <url> (see --help)");
  let server;
  try {
    server = new URL(values.server);
  } catch {
    throw new UsageError(`--server is not an address: ${values.server}`);
  }
  if (server.protocol !== "http:" && server.protocol !== "https:") throw new UsageError("--server must be an http:// or https:// address");
  let pattern;
  try {
    pattern = new RegExp(values["name-pattern"] ?? DEFAULT_PATTERN);
  } catch (error) {
    throw new UsageError(`--name-pattern is not a regular expression: ${error.message}`);
  }
  if (values["test-kind"] !== undefined && !TEST_KINDS.includes(values["test-kind"])) throw new UsageError(`--test-kind must be one of ${TEST_KINDS.join(", ")}`);
  const folder = path.resolve(values.folder);
  try {
    if (!statSync(folder).isDirectory()) throw new Error();
  } catch {
    throw new UsageError(`--folder ${folder} is not a folder`);
  }
  return {
    help: false, folder, server: server.origin + server.pathname.replace(/\/+$/, ""), keyFile: values["key-file"], pattern,
    testKind: values["test-kind"], settleMs: number(values, "settle", 5, 0) * 1000, pollMs: number(values, "poll", 2, 0.05) * 1000,
    limitBytesPerS: number(values, "limit-kib-s", 0, 0) * 1024, maxAttempts: number(values, "max-attempts", 8, 1), once: values.once ?? false,
    logFile: path.resolve(values.log ?? path.join(folder, "drop-folder.log")),
    stateFile: path.resolve(values.state ?? path.join(folder, ".drop-folder-state.json")),
  };
}

/** The station key: from a key file only its owner may read, else from the environment. */
export function readStationKey(options, environment) {
  if (options.keyFile) {
    let info;
    try {
      info = statSync(options.keyFile);
    } catch {
      throw new UsageError(`--key-file ${options.keyFile} cannot be read`);
    }
    if (process.platform !== "win32" && (info.mode & 0o077) !== 0) {
      throw new UsageError(`--key-file ${options.keyFile} is readable by others (mode ${(info.mode & 0o777).toString(8)}): chmod 600 it`);
    }
    const key = readFileSync(options.keyFile, "utf8").trim();
    if (!key) throw new UsageError(`--key-file ${options.keyFile} is empty`);
    return key;
  }
  const key = (environment[KEY_VARIABLE] ?? "").trim();
  if (!key) throw new UsageError(`No station key: set ${KEY_VARIABLE} or give --key-file (see --help)`);
  return key;
}
