// Mutation sweep over the catalogue (scripts/mutants/catalogue.ts): copies the tree (tracked and
// new files, node_modules linked) to a scratch directory, applies one mutant at a time there, runs
// the unit tests mapped to its file with a time limit, restores the file in a finally block and
// checks it byte for byte, and prints mutant, killed/survived and the killing test. The worktree is
// never edited, so tests and editors keep working during a sweep; it is still checked unchanged at
// the end. Exit status 1 when a mutant survives or the worktree changed.
//
//   npm run mutants                      every mutant
//   npm run mutants -- --only thd-01,power-03
//   npm run mutants -- --file lib/analysis/power.ts
//   npm run mutants -- --sample 5        an evenly spaced sample
//   npm run mutants -- --without tests/unit/pins   leave out mapped tests under a folder
//
// Written here rather than taken from Stryker: a Stryker run instruments every operator of
// lib/analysis (thousands of mutants, most of them in the parser) and, on two cores, reruns the
// unit project for each; a curated list of the changes that matter for the formulas and band edges
// runs in minutes and says why each one matters.
import { spawnSync } from "node:child_process";
import { cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { FILE_TESTS, MUTANTS, type Mutant } from "./catalogue";

const ROOT = path.resolve(import.meta.dirname, "../..");
const VITEST = path.join(ROOT, "node_modules/.bin/vitest");
const TIME_LIMIT_MS = 180_000;

type Outcome = { mutant: Mutant; status: "killed" | "survived" | "timeout" | "error"; by: string; seconds: number };

function argument(name: string): string | undefined {
  const index = process.argv.indexOf(name);
  return index >= 0 ? process.argv[index + 1] : undefined;
}

export function selectMutants(): Mutant[] {
  const only = argument("--only")?.split(",");
  const file = argument("--file");
  const sample = argument("--sample");
  let list = MUTANTS.filter((m) => (!only || only.includes(m.id)) && (!file || m.file === file));
  if (sample) {
    const n = Number(sample);
    const step = list.length / n;
    list = Array.from({ length: Math.min(n, list.length) }, (_, i) => list[Math.floor(i * step)] as Mutant);
  }
  return list;
}

export function testsFor(file: string, root = ROOT): string[] {
  const tests = FILE_TESTS[path.basename(file)];
  if (!tests) throw new Error(`no tests mapped for ${file} in FILE_TESTS`);
  const without = argument("--without");
  return tests.filter((t) => existsSync(path.join(root, t)) && !(without && t.startsWith(without)));
}

/** Tracked and new (not ignored) files of the worktree, copied to `into`; node_modules linked. */
export function makeScratchTree(into: string): void {
  const listed = spawnSync("git", ["ls-files", "-z", "--cached", "--others", "--exclude-standard"], { cwd: ROOT, encoding: "utf8" });
  if (listed.status !== 0) throw new Error(`git ls-files failed: ${listed.stderr}`);
  for (const file of listed.stdout.split("\0").filter(Boolean)) {
    const from = path.join(ROOT, file);
    if (!existsSync(from)) continue;
    mkdirSync(path.dirname(path.join(into, file)), { recursive: true });
    cpSync(from, path.join(into, file));
  }
  symlinkSync(path.join(ROOT, "node_modules"), path.join(into, "node_modules"), "dir");
}

function firstFailure(reportFile: string, tree: string): string {
  try {
    const report = JSON.parse(readFileSync(reportFile, "utf8")) as {
      testResults: { name: string; status: string; message?: string; assertionResults: { status: string; fullName: string }[] }[];
    };
    for (const file of report.testResults) {
      const failed = file.assertionResults.find((a) => a.status === "failed");
      if (failed) return `${path.relative(tree, file.name)} › ${failed.fullName}`;
      if (file.status === "failed") return `${path.relative(tree, file.name)} (${(file.message ?? "failed to load").split("\n")[0]})`;
    }
  } catch {
    // no report: the run died before writing one
  }
  return "(no failing test reported)";
}

/** Applies one mutant, runs its tests, and always puts the original bytes back. */
export function runMutant(mutant: Mutant, tree: string, reports: string): Outcome {
  const absolute = path.join(tree, mutant.file);
  const original = readFileSync(absolute, "utf8");
  const at = original.indexOf(mutant.find);
  if (at < 0 || original.indexOf(mutant.find, at + 1) >= 0) return { mutant, status: "error", by: "source text not found exactly once", seconds: 0 };
  const mutated = original.slice(0, at) + mutant.replace + original.slice(at + mutant.find.length);
  const tests = testsFor(mutant.file, tree);
  // With no file named, vitest would run the whole unit project: refuse rather than wait.
  if (tests.length === 0) return { mutant, status: "error", by: "no mapped test file exists", seconds: 0 };
  const reportFile = path.join(reports, `${mutant.id}.json`);
  const started = Date.now();
  try {
    writeFileSync(absolute, mutated);
    const run = spawnSync(VITEST, ["run", "--project", "unit", "--bail", "1", "--reporter", "json", "--outputFile", reportFile, ...tests], {
      cwd: tree,
      encoding: "utf8",
      timeout: TIME_LIMIT_MS,
      killSignal: "SIGKILL",
    });
    const seconds = (Date.now() - started) / 1000;
    if (run.error && (run.error as NodeJS.ErrnoException).code === "ETIMEDOUT") return { mutant, status: "timeout", by: `no result within ${TIME_LIMIT_MS / 1000} s (counted as killed)`, seconds };
    if (run.status === 0) return { mutant, status: "survived", by: "", seconds };
    return { mutant, status: "killed", by: firstFailure(reportFile, tree), seconds };
  } finally {
    writeFileSync(absolute, original);
    if (readFileSync(absolute, "utf8") !== original) throw new Error(`could not restore ${mutant.file} in ${tree}`);
  }
}

/** The mutated files' bytes in the worktree, to show afterwards that the sweep left them alone. */
function snapshot(files: string[]): string[] {
  return files.map((file) => readFileSync(path.join(ROOT, file), "utf8"));
}

async function main(): Promise<void> {
  const mutants = selectMutants();
  const files = [...new Set(mutants.map((m) => m.file))];
  const before = snapshot(files);
  const scratch = mkdtempSync(path.join(os.tmpdir(), "emfolio-mutants-"));
  const tree = path.join(scratch, "tree");
  const reports = path.join(scratch, "reports");
  mkdirSync(reports, { recursive: true });
  makeScratchTree(tree);
  const outcomes: Outcome[] = [];
  const started = Date.now();
  // A signal sets the flag; the loop yields to the event loop between mutants so the handler runs,
  // and the finally below removes the scratch tree. Ctrl-C also reaches the vitest child (same
  // process group), which ends the current run early.
  let stopping = false;
  const stop = () => {
    stopping = true;
  };
  process.on("SIGINT", stop);
  process.on("SIGTERM", stop);
  try {
    for (const [index, mutant] of mutants.entries()) {
      await new Promise((resolve) => setImmediate(resolve));
      if (stopping) break;
      const outcome = runMutant(mutant, tree, reports);
      if (stopping) break;
      outcomes.push(outcome);
      const mark = outcome.status === "survived" ? "SURVIVED" : outcome.status;
      console.log(`[${index + 1}/${mutants.length}] ${mutant.id.padEnd(18)} ${mark.padEnd(8)} ${outcome.seconds.toFixed(1).padStart(5)} s  ${outcome.by || mutant.why}`);
    }
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
  if (stopping) {
    console.error(`mutants: stopped after ${outcomes.length} of ${mutants.length}`);
    process.exit(130);
  }
  const clean = snapshot(files).every((text, i) => text === before[i]);
  const survived = outcomes.filter((o) => o.status === "survived" || o.status === "error");
  console.log("\n| mutant | file | change | result | killed by |\n| --- | --- | --- | --- | --- |");
  for (const o of outcomes) console.log(`| ${o.mutant.id} | ${o.mutant.file} | ${o.mutant.why} | ${o.status} | ${o.by.replaceAll("|", "/")} |`);
  const killed = outcomes.filter((o) => o.status === "killed" || o.status === "timeout").length;
  console.log(`\nmutants: ${outcomes.length}, killed ${killed}, survived ${survived.length}, ${((Date.now() - started) / 1000).toFixed(0)} s; worktree unchanged: ${clean ? "yes" : "NO"}`);
  if (survived.length > 0) console.log(`survivors: ${survived.map((o) => o.mutant.id).join(", ")}`);
  process.exit(survived.length > 0 || !clean ? 1 : 0);
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename)) void main();
