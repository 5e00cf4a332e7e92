"use client";

import { useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { useHydrated } from "@/components/attachments/use-hydrated";
import { removeAttachment, type RemoveAttachmentState } from "../attachment-actions";

/** Remove, then confirm in place (no browser dialog); the server checks the role again. */
export function RemoveAttachmentButton({ attachmentId, unitId, name }: { attachmentId: string; unitId: string; name: string }) {
  const hydrated = useHydrated();
  const [asking, setAsking] = useState(false);
  const [state, action, pending] = useActionState<RemoveAttachmentState, FormData>(removeAttachment, { ok: false, message: "" });
  if (!asking) {
    return (
      <Button type="button" tone="quiet" className="px-3 py-1.5 text-xs" disabled={!hydrated} onClick={() => setAsking(true)}>
        Remove<span className="sr-only"> {name}</span>
      </Button>
    );
  }
  return (
    <form action={action} className="flex items-center gap-2">
      <input type="hidden" name="attachmentId" value={attachmentId} />
      <input type="hidden" name="unitId" value={unitId} />
      {state.message && !state.ok ? <span role="alert" className="text-xs font-semibold text-outside-700">{state.message}</span> : null}
      <Button type="submit" tone="danger" className="px-3 py-1.5 text-xs" disabled={pending}>{pending ? "Removing…" : `Remove “${name}”`}</Button>
      <Button type="button" tone="quiet" className="px-3 py-1.5 text-xs" onClick={() => setAsking(false)}>Keep</Button>
    </form>
  );
}
