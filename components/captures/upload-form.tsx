"use client";

import { useState, type DragEvent, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextArea, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { TEST_KIND_LABELS, TEST_KINDS } from "@/lib/captures/input-schemas";
import { similarSerials } from "@/lib/units/similar-serials";
import { FileEntryCard } from "./file-entry-card";
import { UploadInstruments, type UploadInstrumentOptions } from "./upload-instruments";
import { CaptureQueryProvider } from "./query-provider";
import { useLeaveGuard } from "./use-leave-guard";
import { useUploadQueue, type BatchMeta } from "./use-upload-queue";

export type UploadFormOptions = {
  units: { serial: string; modelCode: string }[];
  ratings: { id: string; label: string }[];
  stations: { id: string; name: string }[];
  maxBytes: number;
  instrumentOptions: UploadInstrumentOptions;
};

function UploadFormInner({ options }: { options: UploadFormOptions }) {
  const queue = useUploadQueue(options.maxBytes);
  const [serial, setSerial] = useState("");
  const [ratingId, setRatingId] = useState("");
  const [testKind, setTestKind] = useState<BatchMeta["testKind"]>("no-load");
  const [speed, setSpeed] = useState("");
  const [stationId, setStationId] = useState(options.stations[0]?.id ?? "");
  const [instrumentIds, setInstrumentIds] = useState<string[]>(options.instrumentOptions.benchSets[options.stations[0]?.id ?? ""] ?? []);
  const [notes, setNotes] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const [dragging, setDragging] = useState(false);
  const [busy, setBusy] = useState(false);

  const known = options.units.some((u) => u.serial === serial.trim());
  const [confirmNew, setConfirmNew] = useState(false);
  const close = serial.trim() && !known ? similarSerials(serial.trim(), options.units.map((u) => u.serial)) : [];
  const ready = queue.entries.filter((e) => e.phase === "ready").length;
  const sending = queue.entries.some((e) => e.phase === "hashing" || e.phase === "uploading" || e.phase === "completing");
  useLeaveGuard(sending);

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    void queue.addFiles(Array.from(e.dataTransfer.files), stationId || undefined);
  };

  const onSubmit = async (e: FormEvent) => {
    e.preventDefault();
    const speedRpm = speed.trim() === "" ? null : Number(speed);
    if (!serial.trim()) return setProblem("Give the unit's serial number.");
    if (!known && !ratingId) return setProblem(`${serial.trim()} is a new unit: pick its rating to register it.`);
    if (!known && !confirmNew) return setProblem(`${serial.trim()} is not on file: confirm it is a new unit${close.length ? ` (or pick ${close.join(", ")})` : ""}.`);
    if (speedRpm !== null && !(speedRpm > 0)) return setProblem("Shaft speed must be a positive number of rpm.");
    if (ready === 0) return setProblem("Add at least one CSV file.");
    setProblem(null);
    setBusy(true);
    await queue.uploadAll({
      unitSerial: serial.trim(), newUnitRatingId: known ? undefined : ratingId, confirmNewUnit: known ? undefined : confirmNew, testKind, speedRpm,
      stationId: stationId || undefined, notes, instruments: instrumentIds,
    });
    setBusy(false);
  };

  return (
    <form onSubmit={onSubmit} className="space-y-6">
      <fieldset className="grid gap-4 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200 md:grid-cols-2">
        <legend className="px-1 text-sm font-semibold">Capture details</legend>
        <Field label="Unit serial" hint={serial && !known ? "Not on file yet: it will be registered with the rating below." : "Pick a unit or type a new serial."}>
          <TextInput list="unit-serials" value={serial} onChange={(e) => setSerial(e.target.value)} autoComplete="off" required />
        </Field>
        <datalist id="unit-serials">{options.units.map((u) => <option key={u.serial} value={u.serial}>{u.modelCode}</option>)}</datalist>
        {serial.trim() && !known ? (
          <div className="space-y-2">
            <Field label="Rating of the new unit">
              <Select value={ratingId} onChange={(e) => setRatingId(e.target.value)}>
                <option value="">Choose a rating…</option>
                {options.ratings.map((r) => <option key={r.id} value={r.id}>{r.label}</option>)}
              </Select>
            </Field>
            {close.length > 0 ? (
              <p className="text-xs" role="status">Close to units on file: {close.map((s) => (
                <button key={s} type="button" className="mr-2 font-mono underline" onClick={() => setSerial(s)}>{s}</button>
              ))}</p>
            ) : null}
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={confirmNew} onChange={(e) => setConfirmNew(e.target.checked)} />
              Register {serial.trim()} as a new unit
            </label>
          </div>
        ) : null}
        <Field label="Test">
          <Select value={testKind} onChange={(e) => setTestKind(e.target.value as BatchMeta["testKind"])}>
            {TEST_KINDS.map((k) => <option key={k} value={k}>{TEST_KIND_LABELS[k]}</option>)}
          </Select>
        </Field>
        <Field label="Shaft speed (rpm)" hint="Needed for back-EMF constants and the pole-count check.">
          <TextInput inputMode="decimal" value={speed} onChange={(e) => setSpeed(e.target.value)} />
        </Field>
        <Field label="Bench">
          <Select value={stationId} onChange={(e) => { setStationId(e.target.value); setInstrumentIds(options.instrumentOptions.benchSets[e.target.value] ?? []); }}>
            <option value="">Not recorded</option>
            {options.stations.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
          </Select>
        </Field>
        <UploadInstruments options={options.instrumentOptions} value={instrumentIds} onChange={setInstrumentIds} />
        <Field label="Notes">
          <TextArea value={notes} onChange={(e) => setNotes(e.target.value)} maxLength={2000} />
        </Field>
      </fieldset>

      <div onDragOver={(e) => { e.preventDefault(); setDragging(true); }} onDragLeave={() => setDragging(false)} onDrop={onDrop}
        className={`rounded-lg border-2 border-dashed px-6 py-8 text-center text-sm ${dragging ? "border-copper-600 bg-copper-50" : "border-ink-200 bg-white"}`}>
        <p className="font-semibold">Drop CSV exports here</p>
        <p className="mt-1 text-ink-600">One or many files, up to {(options.maxBytes / 1024 ** 3).toFixed(1)} GiB each. The header row is read here so you can confirm each channel&apos;s role.</p>
        <label className="mt-3 inline-block cursor-pointer rounded-md bg-white px-4 py-2 font-semibold ring-1 ring-ink-200 hover:bg-ink-100">
          Choose files
          <input type="file" multiple accept=".csv,.txt,.tsv,text/csv" className="sr-only" aria-label="Capture files"
            onChange={(e) => { void queue.addFiles(Array.from(e.target.files ?? []), stationId || undefined); e.target.value = ""; }} />
        </label>
      </div>

      {queue.entries.length > 0 ? (
        <ul className="space-y-3" aria-label="Files">
          {queue.entries.map((entry) => (
            <FileEntryCard key={entry.key} entry={entry} onChange={(c) => queue.patch(entry.key, c)} onRemove={() => queue.remove(entry.key)} />
          ))}
        </ul>
      ) : null}

      {problem ? <Notice kind="problem">{problem}</Notice> : null}
      {sending ? <p className="text-xs text-ink-600" role="status">Keep this page open until every file shows Queued: leaving stops the uploads still in progress.</p> : null}
      <Button type="submit" disabled={busy || ready === 0}>{busy ? "Uploading…" : `Upload ${ready || ""} ${ready === 1 ? "file" : "files"}`.replace("  ", " ")}</Button>
    </form>
  );
}

/** The operator's upload form, with its own query client for live states. */
export function UploadForm({ options }: { options: UploadFormOptions }) {
  return (
    <CaptureQueryProvider>
      <UploadFormInner options={options} />
    </CaptureQueryProvider>
  );
}
