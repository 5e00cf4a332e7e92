import { outageSentence, ServiceOutage } from "@/lib/server/outage";

// What a capture's page and the API say about an analysis that did not finish. Sentences only:
// the error's own text (SQL with parameters, hosts, ports, stacks) goes to the worker's log.

/** Marks the sentence of an outage, so the sweep can tell it from a genuine failure in a job's failed reason. */
export const OUTAGE_MARK = "was unreachable; the analysis will be retried";

export function failureMessage(err: unknown, attempt: number, allowed: number): string {
  if (err instanceof ServiceOutage) return outageSentence(err.service, "analysis");
  if (attempt >= allowed) {
    return `The analysis stopped on an internal error ${attempt} times (the details are in the worker's log). It can be re-run once the cause is fixed.`;
  }
  return `The analysis stopped on an internal error (attempt ${attempt} of ${allowed}, the details are in the worker's log); it will be retried shortly.`;
}

/** True for a failed reason written by an outage (see failureMessage). */
export function isOutageReason(reason: string | undefined): boolean {
  return reason !== undefined && reason.includes(OUTAGE_MARK);
}
