import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { MUTANTS, type Mutant } from "@/scripts/mutants/catalogue";
import { makeScratchTree, runMutant } from "@/scripts/mutants/run";

// The sweep end to end on a small sample (the full sweep is `npm run mutants`, minutes long): five
// catalogue mutants from different areas must be killed, a change that alters nothing must survive,
// and the scratch file must be back to its bytes after each run.
const SAMPLE = ["thd-01", "power-01", "verdicts-03", "presets-01", "path-rules-01"];
const scratch = mkdtempSync(path.join(os.tmpdir(), "emfolio-mutants-sample-"));
const tree = path.join(scratch, "tree");
makeScratchTree(tree);
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

describe("runMutant on a sample of the catalogue", () => {
  it.each(SAMPLE)("runMutant(%s) is killed by a unit test and leaves the file as it was", (id) => {
    const mutant = MUTANTS.find((m) => m.id === id)!;
    const before = readFileSync(path.join(tree, mutant.file), "utf8");
    const outcome = runMutant(mutant, tree, scratch);
    expect(outcome.status, outcome.by).toBe("killed");
    expect(outcome.by).toMatch(/^tests\/unit\//);
    expect(readFileSync(path.join(tree, mutant.file), "utf8")).toBe(before);
  }, 60_000);

  it("runMutant reports a change that alters no behaviour as survived (the runner can tell)", () => {
    const harmless: Mutant = { id: "harmless", file: "lib/analysis/thd.ts", find: "let squares = 0;", replace: "let squares = 0; // harmless", why: "a comment" };
    expect(runMutant(harmless, tree, scratch).status).toBe("survived");
  }, 60_000);
});
