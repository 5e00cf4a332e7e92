"use client";

import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { postReanalyseRating } from "./fetchers";
import { CaptureQueryProvider } from "./query-provider";

function Inner({ ratings }: { ratings: { id: string; label: string }[] }) {
  const [ratingId, setRatingId] = useState(ratings[0]?.id ?? "");
  const mutation = useMutation({ mutationFn: () => postReanalyseRating(ratingId) });
  return (
    <form onSubmit={(e) => { e.preventDefault(); mutation.mutate(); }} className="flex flex-wrap items-end gap-3 rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200">
      <div className="min-w-72 flex-1">
        <Field label="Re-analyse every finished capture of a rating" hint="After an engine upgrade or a tolerance edit. Earlier results stay in each capture's history.">
          <Select value={ratingId} onChange={(e) => setRatingId(e.target.value)}>
            {ratings.map((r) => <option key={r.id} value={r.id}>{r.label}</option>)}
          </Select>
        </Field>
      </div>
      <Button type="submit" tone="quiet" disabled={mutation.isPending || !ratingId}>Queue re-analysis</Button>
      {mutation.data ? <p role="status" className="w-full text-sm">{mutation.data.queued} capture(s) queued.</p> : null}
      {mutation.error ? <p className="w-full text-sm font-semibold text-outside-700">{mutation.error.message}</p> : null}
    </form>
  );
}

/** Lab managers only (the handler checks again). */
export function ReanalyseRatingForm({ ratings }: { ratings: { id: string; label: string }[] }) {
  return <CaptureQueryProvider><Inner ratings={ratings} /></CaptureQueryProvider>;
}
