import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { EXEMPT, FILE_TESTS, MUTANTS } from "@/scripts/mutants/catalogue";

const ROOT = path.resolve(import.meta.dirname, "../../..");
const read = (file: string) => readFileSync(path.join(ROOT, file), "utf8");
const occurrences = (text: string, find: string) => text.split(find).length - 1;

// A file "has arithmetic" when it calls Math, multiplies or divides, or compares with a number.
const ARITHMETIC = /Math\.|[\w)\]] [*/] [\w(]|[<>]=? ?\d/;

describe("mutant catalogue (scripts/mutants/catalogue.ts)", () => {
  it("MUTANTS has 80 or more entries with unique ids and real changes", () => {
    expect(MUTANTS.length).toBeGreaterThanOrEqual(80);
    expect(new Set(MUTANTS.map((m) => m.id)).size).toBe(MUTANTS.length);
    for (const m of MUTANTS) expect(m.replace, m.id).not.toBe(m.find);
  });

  it("MUTANTS' source texts each occur exactly once in their files (the catalogue follows the source)", () => {
    const missing = MUTANTS.filter((m) => !existsSync(path.join(ROOT, m.file)) || occurrences(read(m.file), m.find) !== 1).map((m) => m.id);
    expect(missing).toEqual([]);
  });

  it("FILE_TESTS maps every mutated file to test files that exist", () => {
    for (const m of MUTANTS) {
      const tests = FILE_TESTS[path.basename(m.file)];
      expect(tests, m.file).toBeDefined();
      for (const t of tests!) expect(existsSync(path.join(ROOT, t)), t).toBe(true);
    }
  });

  it("every lib/analysis file with arithmetic is in the catalogue or in the reasoned exemption list", () => {
    const covered = new Set(MUTANTS.map((m) => path.basename(m.file)));
    const files = readdirSync(path.join(ROOT, "lib/analysis")).filter((f) => f.endsWith(".ts"));
    const uncovered = files.filter((f) => ARITHMETIC.test(read(`lib/analysis/${f}`)) && !covered.has(f) && !(f in EXEMPT));
    expect(uncovered).toEqual([]);
    for (const [file, why] of Object.entries(EXEMPT)) {
      expect(files, file).toContain(file);
      expect(covered.has(file), `${file} is both exempt and mutated`).toBe(false);
      expect(why.length).toBeGreaterThan(10);
    }
  });
});
