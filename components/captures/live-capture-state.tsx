"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { StatusTag } from "@/components/ui/status-tag";
import { CaptureStateBadge, captureStateWord, ProgressBar } from "./capture-state-badge";
import { captureKeys, fetchCaptureStatus, isFinalState } from "./fetchers";

/** Polls one capture until it reaches a final state, keeping the trail of states it went through. */
export function LiveCaptureState({ captureId, firstState }: { captureId: string; firstState: string | null }) {
  const query = useQuery({
    queryKey: captureKeys.status(captureId),
    queryFn: () => fetchCaptureStatus(captureId),
    refetchInterval: (q) => (q.state.data && isFinalState(q.state.data.state) ? false : 1000),
  });
  const [trail, setTrail] = useState<string[]>(firstState ? [firstState] : []);
  const state = query.data?.state;
  // Derived during render (not in an effect): each newly seen state is appended once.
  if (state && trail[trail.length - 1] !== state) setTrail([...trail, state]);
  if (!query.data) return <p className="text-xs text-ink-600">{query.error ? query.error.message : "Checking state…"}</p>;
  const c = query.data;
  return (
    <div className="mt-2 text-sm">
      <div className="flex flex-wrap items-center gap-3">
        <CaptureStateBadge state={c.state} progress={c.progress} />
        {c.state === "analysed" && c.analysis ? <span data-testid="upload-verdict" className="text-base"><StatusTag status={c.analysis.report.overall} /></span> : null}
        <span data-testid="state-trail" className="text-xs text-ink-600">
          {trail.map((s) => captureStateWord(s as typeof c.state)).join(" → ")}
        </span>
        <Link href={`/captures/${c.id}`} className="text-xs font-semibold">Open capture</Link>
      </div>
      {c.state === "analysing" ? <ProgressBar fraction={c.progress / 100} label="Analysis" /> : null}
      {c.stateMessage ? <p className={`mt-1 text-xs ${c.state === "rejected" || c.state === "failed" ? "font-semibold text-outside-700" : "text-ink-600"}`}>{c.stateMessage}</p> : null}
    </div>
  );
}
