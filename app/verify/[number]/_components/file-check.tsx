"use client";

import { useState, type DragEvent } from "react";

type Revision = { revision: number; statusWords: string; sha256: string };
type Outcome = { kind: "match"; revision: Revision } | { kind: "no-match"; hash: string } | { kind: "problem"; message: string };

const MAX_BYTES = 100 * 1024 * 1024;

async function sha256Hex(file: File): Promise<string> {
  const digest = await crypto.subtle.digest("SHA-256", await file.arrayBuffer());
  return Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, "0")).join("");
}

/** Drop or pick a PDF: its SHA-256 is computed in the browser and compared with the released files; nothing is uploaded. */
export function FileCheck({ number, revisions }: { number: string; revisions: Revision[] }) {
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const [busy, setBusy] = useState(false);
  const [over, setOver] = useState(false);

  async function check(file: File | undefined) {
    if (!file) return;
    if (file.size > MAX_BYTES) return setOutcome({ kind: "problem", message: `${file.name} is larger than 100 MiB: no released report is that large.` });
    if (!globalThis.crypto?.subtle) return setOutcome({ kind: "problem", message: "This browser cannot compute SHA-256 here (open the page over https or on this computer)." });
    setBusy(true);
    try {
      const hash = await sha256Hex(file);
      const found = revisions.find((r) => r.sha256 === hash);
      setOutcome(found ? { kind: "match", revision: found } : { kind: "no-match", hash });
    } catch {
      setOutcome({ kind: "problem", message: `${file.name} could not be read.` });
    } finally {
      setBusy(false);
    }
  }

  const onDrop = (e: DragEvent<HTMLLabelElement>) => {
    e.preventDefault();
    setOver(false);
    void check(e.dataTransfer.files[0]);
  };

  return (
    <section aria-labelledby="file-check" className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-ink-200">
      <h2 id="file-check" className="font-semibold">Check a file</h2>
      <label
        onDragOver={(e) => { e.preventDefault(); setOver(true); }} onDragLeave={() => setOver(false)} onDrop={onDrop}
        className={`mt-3 flex cursor-pointer flex-col items-center rounded-md border-2 border-dashed px-4 py-8 text-center text-sm ${over ? "border-copper-600 bg-copper-50" : "border-ink-200"}`}
      >
        <span className="font-semibold">Drop the PDF here, or choose it</span>
        <span className="mt-1 text-ink-600">The file stays on your computer: only its SHA-256 is compared.</span>
        <input type="file" accept="application/pdf,.pdf" className="sr-only" data-testid="verify-file" onChange={(e) => void check(e.target.files?.[0])} />
      </label>
      <div aria-live="polite" className="mt-4 text-sm" data-testid="file-outcome">
        {busy ? "Computing the file's SHA-256…" : null}
        {!busy && outcome?.kind === "match" ? (
          <p><strong>This is a released file of report {number}</strong>: revision {outcome.revision.revision}, status <strong>{outcome.revision.statusWords}</strong>.</p>
        ) : null}
        {!busy && outcome?.kind === "no-match" ? (
          <p><strong>Not a released file of report {number}.</strong> Its SHA-256 is <span className="break-all font-mono text-xs">{outcome.hash}</span>, which matches no revision above.</p>
        ) : null}
        {!busy && outcome?.kind === "problem" ? <p>{outcome.message}</p> : null}
      </div>
    </section>
  );
}
