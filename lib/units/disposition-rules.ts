// Which disposition changes are allowed, and what each one needs (a reason, a concession reference,
// a password signature). Pure: the DAL reads the unit, asks here, then signs and writes.

export const DISPOSITIONS = ["open", "accepted", "accepted-with-concession", "rework", "scrapped"] as const;
export type DispositionValue = (typeof DISPOSITIONS)[number];
type PlanStateValue = "incomplete" | "complete-within" | "failed" | "inconclusive";
type Overall = "pass" | "marginal" | "fail" | "not-applicable" | "inconclusive" | "not-required";

export const DISPOSITION_WORDS: Record<DispositionValue, string> = {
  open: "open (no decision)",
  accepted: "accepted",
  "accepted-with-concession": "accepted with concession",
  rework: "returned for rework",
  scrapped: "scrapped",
};

/** Dispositions that close the unit: only reopening (signed) changes them again. */
export const CLOSED_DISPOSITIONS: readonly DispositionValue[] = ["accepted", "accepted-with-concession", "scrapped"];

export const MIN_REASON_LENGTH = 5;

export type DispositionUnitFacts = { disposition: DispositionValue; planState: PlanStateValue; latestOverall: Overall | null };
export type DispositionChange = { to: DispositionValue; reason: string; concessionRef: string };
export type SignaturePurposeForChange = "concession" | "scrap" | "reopen";

export type DispositionDecision =
  | { allowed: true; signature: SignaturePurposeForChange | null }
  | { allowed: false; field: "to" | "reason" | "concessionRef"; message: string };

const PLAN_REASONS: Record<Exclude<PlanStateValue, "complete-within">, string> = {
  incomplete: "its test plan is not complete (a plan step has no capture of record)",
  failed: "a plan step failed",
  inconclusive: "a plan step is inconclusive",
};

/**
 * Why a unit is not "complete and within" (plan complete and within, latest verdict neither outside nor
 * inconclusive), or null when it is. Missing evidence never counts as within.
 */
export function whyNotWithin(unit: Pick<DispositionUnitFacts, "planState" | "latestOverall">): string | null {
  const reasons: string[] = [];
  if (unit.planState !== "complete-within") reasons.push(PLAN_REASONS[unit.planState]);
  if (unit.latestOverall === "fail") reasons.push("its latest verdict is outside tolerance");
  else if (unit.latestOverall === "inconclusive") reasons.push("its latest verdict is inconclusive");
  else if (unit.latestOverall === null) reasons.push("it has no judged capture");
  return reasons.length > 0 ? reasons.join(" and ") : null;
}

/** Whether a change of disposition is allowed, and the signature it needs; a refusal names the field and why. */
export function decideDisposition(unit: DispositionUnitFacts, change: DispositionChange): DispositionDecision {
  const reason = change.reason.trim();
  const ref = change.concessionRef.trim();
  if (unit.disposition === change.to) {
    return { allowed: false, field: "to", message: `The unit is already ${DISPOSITION_WORDS[change.to]}: pick another disposition.` };
  }
  const closed = CLOSED_DISPOSITIONS.includes(unit.disposition);
  if (closed && change.to !== "open") {
    return { allowed: false, field: "to", message: `The unit is ${DISPOSITION_WORDS[unit.disposition]}: reopen it first (signed, with a reason).` };
  }
  if (reason.length < MIN_REASON_LENGTH) {
    const what = closed ? "Reopening a closed unit" : "Every change of disposition";
    return { allowed: false, field: "reason", message: `${what} needs a reason for the record (at least ${MIN_REASON_LENGTH} characters).` };
  }
  if (change.to === "accepted") {
    const why = whyNotWithin(unit);
    if (why) {
      return { allowed: false, field: "to", message: `Plain acceptance is refused: ${why}. Accept it with a concession instead, giving the client's concession reference.` };
    }
    return { allowed: true, signature: null };
  }
  if (change.to === "accepted-with-concession") {
    if (ref.length === 0) return { allowed: false, field: "concessionRef", message: "A concession needs the client's concession reference." };
    return { allowed: true, signature: "concession" };
  }
  if (change.to === "scrapped") return { allowed: true, signature: "scrap" };
  if (change.to === "open") return { allowed: true, signature: closed ? "reopen" : null };
  return { allowed: true, signature: null };
}

/** Dispositions a bulk action may set: those needing no per-unit reference or signature. */
export const BULK_DISPOSITIONS: readonly DispositionValue[] = ["accepted", "rework"];
