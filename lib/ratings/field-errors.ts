import type { z } from "zod";

/** Zod issues as { "checks.voltage.lowerPercent": "message" }: the first message per field, keyed by its dotted path. */
export function fieldErrorsOf(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "form";
    out[key] ??= issue.message;
  }
  return out;
}

/** "nameplate.poles: Poles come in pairs…; modelCode: …" for an API error message. */
export function describeFieldErrors(fields: Record<string, string>): string {
  return Object.entries(fields).map(([k, m]) => `${k}: ${m}`).join("; ");
}
