"use client";

import { useRouter } from "next/navigation";
import { useEffect } from "react";

const BUSY = new Set(["queued", "analysing"]);

/**
 * Re-renders the server page every few seconds while captures on it are queued or analysing, so
 * lists follow the worker without a manual reload; it stops once nothing is left in progress.
 */
export function RefreshWhileBusy({ states, everyMs = 2_000 }: { states: readonly string[]; everyMs?: number }) {
  const router = useRouter();
  // Queued and analysing are the only states that change by themselves.
  const busy = states.some((s) => BUSY.has(s));
  useEffect(() => {
    if (!busy) return;
    const timer = setInterval(() => router.refresh(), everyMs);
    return () => clearInterval(timer);
  }, [busy, everyMs, router]);
  return busy ? <span className="sr-only" data-testid="refreshing">Updating while analyses run</span> : null;
}
