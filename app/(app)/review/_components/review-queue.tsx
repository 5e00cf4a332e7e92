"use client";

import Link from "next/link";
import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextArea } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { StatusTag } from "@/components/ui/status-tag";
import type { QueueFinding } from "@/lib/dal/review";
import { describeExceedance } from "@/lib/units/check-exceedance";
import { actOnQueue, type QueueState } from "../actions";

type QueueUnit = {
  id: string; serial: string; latestOverall: Parameters<typeof StatusTag>[0]["status"]; latestCaptureAt: Date | null; modelCode: string; owner: string;
  assignee: string | null; mine: boolean; findings: QueueFinding[]; missingSteps: string[];
};

function Findings({ unit }: { unit: QueueUnit }) {
  if (unit.findings.length === 0 && unit.missingSteps.length === 0) return null;
  return (
    <ul className="mt-1 space-y-0.5 text-xs text-ink-800" data-testid="queue-findings">
      {unit.findings.map((f, i) => (
        <li key={`${f.check}-${i}`}>
          <span className="font-semibold">{f.label}</span>{f.step ? ` (${f.step})` : ""}: {f.status === "fail" ? "outside" : "inconclusive"}, measured {f.measured}, limit {f.limit}
          {f.exceedance ? `, ${describeExceedance(f.exceedance, f.unit)}` : ""}
          {f.status === "inconclusive" && f.reason ? ` (${f.reason.length > 140 ? `${f.reason.slice(0, 140)}…` : f.reason})` : ""}
        </li>
      ))}
      {unit.missingSteps.length > 0 ? <li><span className="font-semibold">Plan steps missing:</span> {unit.missingSteps.join(", ")}</li> : null}
    </ul>
  );
}

/** The queue as one form: tick units, then take them, assign them, or give them one disposition with one reason. */
export function ReviewQueue({ units, reviewers }: { units: QueueUnit[]; reviewers: { id: string; name: string }[] }) {
  const [state, action, pending] = useActionState<QueueState, FormData>(actOnQueue, { ok: false, message: "" });
  const serialOf = new Map(units.map((u) => [u.id, u.serial]));
  return (
    <form action={action} className="space-y-4">
      {state.message ? (
        <Notice kind={state.ok ? "done" : "problem"}>
          {state.message}
          {state.results?.some((r) => !r.ok) ? (
            <ul className="mt-1 list-disc pl-5">{state.results.filter((r) => !r.ok).map((r) => <li key={r.unitId}>{serialOf.get(r.unitId) ?? "a unit"}: {r.message}</li>)}</ul>
          ) : null}
        </Notice>
      ) : null}
      <ul className="divide-y divide-ink-100 rounded-lg bg-white shadow-sm ring-1 ring-ink-200" aria-label="Units waiting for review">
        {units.map((u) => (
          <li key={u.id} className="flex flex-wrap items-start gap-4 px-4 py-3" data-testid="queue-row">
            <input type="checkbox" name="unitIds" value={u.id} aria-label={`Select ${u.serial}`} className="mt-1" />
            <StatusTag status={u.latestOverall} />
            <div className="min-w-0 flex-1">
              <Link href={`/units/${u.id}`} className="font-mono font-semibold">{u.serial}</Link>
              <span className="ml-3 text-sm text-ink-600">{u.modelCode} · {u.owner}</span>
              <Findings unit={u} />
            </div>
            <div className="text-right text-xs text-ink-600">
              <p>{u.assignee ? `Assigned to ${u.mine ? "you" : u.assignee}` : "Not assigned"}</p>
              <p>{u.latestCaptureAt ? `captured ${u.latestCaptureAt.toISOString().slice(0, 16).replace("T", " ")} UTC` : ""}</p>
            </div>
          </li>
        ))}
      </ul>
      <div className="grid gap-4 rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200 md:grid-cols-3">
        <div className="space-y-2">
          <Button type="submit" name="intent" value="take" disabled={pending}>Take the ticked units</Button>
        </div>
        <div className="space-y-2">
          <Field label="Assign to">
            <Select name="assigneeId" defaultValue="">
              <option value="">Choose a reviewer</option>
              {reviewers.map((r) => <option key={r.id} value={r.id}>{r.name}</option>)}
            </Select>
          </Field>
          <Button type="submit" tone="quiet" name="intent" value="assign" disabled={pending}>Assign the ticked units</Button>
        </div>
        <div className="space-y-2">
          <Field label="Disposition for the ticked units" hint="Concessions, scrapping and reopening are signed one unit at a time, on the unit's page.">
            <Select name="to" defaultValue="rework">
              <option value="rework">Return for rework</option>
              <option value="accepted">Accepted (only units complete and within)</option>
            </Select>
          </Field>
          <Field label="Reason, the same for each">
            <TextArea name="reason" maxLength={2000} />
          </Field>
          <Button type="submit" tone="quiet" name="intent" value="disposition" disabled={pending}>Record for the ticked units</Button>
        </div>
      </div>
    </form>
  );
}
