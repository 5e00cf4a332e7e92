import type { z } from "zod";

type Issue = z.core.$ZodIssue;

/**
 * For a union that matched no branch (a band with `required: true` but no limits), the issues of the
 * branch whose `required` matched: "Limit must be a number" on maxPercent, not "Invalid input".
 */
function expand(issue: Issue, prefix: PropertyKey[]): { path: PropertyKey[]; message: string }[] {
  const path = [...prefix, ...issue.path];
  if (issue.code === "invalid_union" && issue.errors.length > 0) {
    const branch = issue.errors.find((b) => !b.some((i) => i.path.length === 1 && i.path[0] === "required")) ?? issue.errors[0] ?? [];
    if (branch.length > 0) return branch.flatMap((i) => expand(i, path));
  }
  return [{ path, message: issue.message }];
}

/** Zod issues as { "checks.voltage.lowerPercent": "message" }: the first message per field, keyed by its dotted path. */
export function fieldErrorsOf(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues.flatMap((i) => expand(i, []))) {
    const key = issue.path.map(String).join(".") || "form";
    out[key] ??= issue.message;
  }
  return out;
}

/** "nameplate.poles: Poles come in pairs…; modelCode: …" for an API error message. */
export function describeFieldErrors(fields: Record<string, string>): string {
  return Object.entries(fields).map(([k, m]) => `${k}: ${m}`).join("; ");
}
