"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { captureKeys, postReanalyse } from "./fetchers";

/** Queues a new run with the current engine and tolerance profile; the earlier result stays in history. */
export function ReanalyseButton({ captureId }: { captureId: string }) {
  const client = useQueryClient();
  const mutation = useMutation({
    mutationFn: () => postReanalyse(captureId),
    onSuccess: () => client.invalidateQueries({ queryKey: captureKeys.status(captureId) }),
  });
  return (
    <span className="flex items-center gap-2">
      <Button type="button" tone="quiet" disabled={mutation.isPending} onClick={() => mutation.mutate()}>Re-run analysis</Button>
      {mutation.error ? <span className="text-xs font-semibold text-outside-700">{mutation.error.message}</span> : null}
    </span>
  );
}
