import { readFileSync } from "node:fs";
import path from "node:path";
import { ESLint } from "eslint";
import { beforeAll, describe, expect, it } from "vitest";

// Runs the project's own ESLint configuration (its Node API) on planted violations: each fixture is
// linted as if it lived at `at`, and must fail with `rule` (or, for the controls, pass).
const root = path.resolve(import.meta.dirname, "../../..");
const fixture = (name: string) => readFileSync(path.join(root, "tests/fixtures/lint", `${name}.txt`), "utf8");

let eslint: ESLint;
beforeAll(() => {
  eslint = new ESLint({ cwd: root });
});

async function errorsOf(name: string, at: string): Promise<string[]> {
  const [result] = await eslint.lintText(fixture(name), { filePath: path.join(root, at) });
  if (!result) throw new Error("ESLint returned no result");
  const fatal = result.messages.filter((m) => m.fatal);
  if (fatal.length) throw new Error(`fixture ${name} does not parse: ${fatal[0]?.message}`);
  return result.messages.filter((m) => m.severity === 2).map((m) => m.ruleId ?? "");
}

const planted: { name: string; at: string; rule: string }[] = [
  { name: "db-client-outside-queries.ts", at: "lib/dal/planted.ts", rule: "emfolio/db-client-only-in-queries" },
  { name: "db-client-outside-queries.ts", at: "worker/planted.ts", rule: "emfolio/db-client-only-in-queries" },
  { name: "db-client-outside-queries.ts", at: "scripts/planted.ts", rule: "emfolio/db-client-only-in-queries" },
  { name: "db-client-relative.ts", at: "db/seeding/planted.ts", rule: "emfolio/db-client-only-in-queries" },
  { name: "process-env.ts", at: "lib/dal/planted.ts", rule: "no-restricted-properties" },
  { name: "process-env.ts", at: "app/api/planted/route.ts", rule: "no-restricted-properties" },
  { name: "process-env-destructured.ts", at: "worker/planted.ts", rule: "no-restricted-properties" },
  { name: "process-env-import.ts", at: "lib/server/planted.ts", rule: "no-restricted-imports" },
  { name: "process-env.ts", at: "lib/analysis/planted.ts", rule: "no-restricted-properties" },
  { name: "analysis-fs.ts", at: "lib/analysis/planted.ts", rule: "no-restricted-imports" },
  { name: "analysis-server-module.ts", at: "lib/analysis/planted.ts", rule: "no-restricted-imports" },
  { name: "analysis-date-now.ts", at: "lib/analysis/planted.ts", rule: "no-restricted-properties" },
  { name: "analysis-new-date.ts", at: "lib/analysis/planted.ts", rule: "no-restricted-syntax" },
  { name: "analysis-math-random.ts", at: "lib/analysis/planted.ts", rule: "no-restricted-properties" },
  { name: "analysis-console.ts", at: "lib/analysis/planted.ts", rule: "no-restricted-globals" },
  { name: "analysis-process.ts", at: "lib/analysis/planted.ts", rule: "no-restricted-globals" },
  { name: "ui-db-query.tsx", at: "app/(app)/planted/page.tsx", rule: "emfolio/no-db-in-ui" },
  { name: "ui-db-query.tsx", at: "components/planted/widget.tsx", rule: "emfolio/no-db-in-ui" },
  { name: "ui-db-schema-value.tsx", at: "components/planted/widget.tsx", rule: "emfolio/no-db-in-ui" },
];

const allowed: { name: string; at: string }[] = [
  { name: "db-client-outside-queries.ts", at: "db/queries/planted.ts" },
  { name: "db-client-relative.ts", at: "db/queries/planted.ts" },
  { name: "process-env.ts", at: "lib/server/env.ts" },
  { name: "analysis-pure.ts", at: "lib/analysis/planted.ts" },
  { name: "ui-db-schema-type.tsx", at: "components/planted/widget.tsx" },
  { name: "analysis-date-now.ts", at: "lib/dal/planted.ts" },
];

describe("ESLint layer rules (eslint.config.mjs)", () => {
  it.each(planted)("lintText of $name at $at fails with $rule", async ({ name, at, rule }) => {
    expect(await errorsOf(name, at)).toContain(rule);
  }, 60_000);

  it.each(allowed)("lintText of $name at $at passes", async ({ name, at }) => {
    expect(await errorsOf(name, at)).toEqual([]);
  }, 60_000);
});
