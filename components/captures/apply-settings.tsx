"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { patchCapture } from "./fetchers";

const FIELD_WORDS: Record<string, string> = { testKind: "test", speedRpm: "shaft speed", channelRoles: "channel roles", probeScales: "probe ratios", channelOffsets: "offsets" };

/** The same file was stored before with other settings: offer to apply the ones just sent as a correction. */
export function ApplySettings({ captureId, differ }: { captureId: string; differ: Record<string, [unknown, unknown]> }) {
  const [state, setState] = useState<"idle" | "busy" | "done" | string>("idle");
  const fields = Object.keys(differ);
  const apply = async () => {
    setState("busy");
    try {
      await patchCapture(captureId, { ...Object.fromEntries(fields.map((f) => [f, differ[f]?.[1]])), reason: "The same file was sent again with these settings" });
      setState("done");
    } catch (err) {
      setState(err instanceof Error ? err.message : String(err));
    }
  };
  return (
    <div className="mt-2 rounded-md bg-edge-100 p-3 text-sm" data-testid="settings-differ">
      <p>This file is already stored for the unit, with other {fields.map((f) => FIELD_WORDS[f] ?? f).join(", ")} than you sent.</p>
      {state === "done" ? <p className="mt-1 font-semibold">Applied: the capture is being analysed again; its earlier result stays in the history.</p> : (
        <Button type="button" tone="quiet" className="mt-2" disabled={state === "busy"} onClick={() => void apply()}>Apply the settings sent now</Button>
      )}
      {state !== "idle" && state !== "busy" && state !== "done" ? <p className="mt-1 font-semibold text-outside-700">{state}</p> : null}
    </div>
  );
}
