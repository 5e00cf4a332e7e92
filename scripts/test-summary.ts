// Adds up the JSON reports of Vitest and Playwright into one closing line: "tests: N passed, N failed".
import { readFileSync } from "node:fs";

type VitestReport = { numPassedTests: number; numFailedTests: number; numPendingTests?: number };
type PlaywrightReport = { stats: { expected: number; unexpected: number; flaky: number; skipped: number } };

let passed = 0, failed = 0, skipped = 0;
for (const file of process.argv.slice(2)) {
  const data = JSON.parse(readFileSync(file, "utf8")) as Partial<VitestReport & PlaywrightReport>;
  if (data.stats) {
    passed += data.stats.expected + data.stats.flaky;
    failed += data.stats.unexpected;
    skipped += data.stats.skipped;
  } else {
    passed += data.numPassedTests ?? 0;
    failed += data.numFailedTests ?? 0;
    skipped += data.numPendingTests ?? 0;
  }
  console.log(`${file}: ${JSON.stringify(data.stats ?? { passed: data.numPassedTests, failed: data.numFailedTests })}`);
}
console.log(`tests: ${passed} passed, ${failed} failed, ${skipped} skipped`);
if (failed > 0 || passed === 0) process.exitCode = 1;
