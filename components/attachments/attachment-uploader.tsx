"use client";

import { useRouter } from "next/navigation";
import { useState, type DragEvent, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import {
  ATTACHMENT_KIND_LABELS, ATTACHMENT_KINDS, ATTACHMENT_MAX_BYTES, ATTACHMENT_MAX_FILES, ATTACHMENT_TYPES,
  checkAttachmentFiles, formatBytes,
} from "@/lib/attachments/rules";
import { useHydrated } from "./use-hydrated";
import { useUploadThing } from "./uploadthing";

type Kind = (typeof ATTACHMENT_KINDS)[number];
type Outcome = { kind: "done" | "problem"; text: string } | null;

const ACCEPT = Object.keys(ATTACHMENT_TYPES).join(",");

/** Picks files (or takes them dropped), checks them against the rules, uploads them through uploadthing. */
export function AttachmentUploader({ unitId }: { unitId: string }) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [files, setFiles] = useState<File[]>([]);
  const [kind, setKind] = useState<Kind>("nameplate");
  const [caption, setCaption] = useState("");
  const [progress, setProgress] = useState(0);
  const [outcome, setOutcome] = useState<Outcome>(null);
  const [dragging, setDragging] = useState(false);
  // Remounts the file input after an upload so the same file can be picked again.
  const [inputKey, setInputKey] = useState(0);
  const { startUpload, isUploading } = useUploadThing("unitAttachment", {
    onUploadProgress: setProgress,
    onClientUploadComplete: (done) => {
      setOutcome({ kind: "done", text: `Attached ${done.length === 1 ? `“${done[0]?.name}”` : `${done.length} files`}.` });
      setFiles([]);
      setCaption("");
      setInputKey((k) => k + 1);
      router.refresh();
    },
    onUploadError: (err) => setOutcome({ kind: "problem", text: `Nothing was attached: ${err.message}` }),
  });

  const problems = files.length > 0 ? checkAttachmentFiles(files) : [];
  const choose = (list: FileList | null) => {
    setOutcome(null);
    setFiles(Array.from(list ?? []));
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    choose(e.dataTransfer.files);
  };
  const onSubmit = async (e: FormEvent) => {
    e.preventDefault();
    if (files.length === 0 || problems.length > 0) return;
    setOutcome(null);
    setProgress(0);
    await startUpload(files, { unitId, kind, caption });
  };

  return (
    <form onSubmit={onSubmit} aria-label="Attach files" className="mb-5 grid gap-4 rounded-md border border-ink-200 bg-ink-50 p-4 md:grid-cols-[1fr_1fr]">
      <div
        onDragOver={(e) => { e.preventDefault(); setDragging(true); }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={`rounded-md border-2 border-dashed p-4 text-sm md:row-span-2 ${dragging ? "border-copper-600 bg-copper-50" : "border-ink-200 bg-white"}`}
      >
        <Field label="Files" hint={`PNG, JPEG, WebP or PDF; up to ${formatBytes(ATTACHMENT_MAX_BYTES)} each, ${ATTACHMENT_MAX_FILES} at a time. Drop them here or browse.`}>
          <input
            key={inputKey}
            type="file"
            multiple
            accept={ACCEPT}
            disabled={!hydrated || isUploading}
            onChange={(e) => choose(e.target.files)}
            className="mt-2 block w-full text-sm file:mr-3 file:rounded-md file:border-0 file:bg-copper-600 file:px-3 file:py-2 file:font-semibold file:text-white"
          />
        </Field>
        {files.length > 0 ? (
          <ul className="mt-3 space-y-1 text-xs text-ink-600" aria-label="Chosen files">
            {files.map((f, i) => <li key={`${f.name}-${i}`}><span className="font-medium text-ink-800">{f.name}</span> · {formatBytes(f.size)}</li>)}
          </ul>
        ) : null}
      </div>
      <Field label="Kind">
        <Select value={kind} onChange={(e) => setKind(e.target.value as Kind)}>
          {ATTACHMENT_KINDS.map((k) => <option key={k} value={k}>{ATTACHMENT_KIND_LABELS[k]}</option>)}
        </Select>
      </Field>
      <div className="space-y-3">
        <Field label="Caption" hint="Optional, applies to every file of this upload.">
          <TextInput value={caption} maxLength={200} onChange={(e) => setCaption(e.target.value)} />
        </Field>
        <Button type="submit" disabled={!hydrated || isUploading || files.length === 0 || problems.length > 0}>
          {isUploading ? `Uploading… ${progress} %` : "Attach files"}
        </Button>
      </div>
      {problems.length > 0 || outcome ? (
        <div className="space-y-2 md:col-span-2">
          {problems.length > 0 ? (
            <Notice kind="problem" title="These files cannot be attached">
              <ul className="list-disc pl-4">{problems.map((p) => <li key={p}>{p}</li>)}</ul>
            </Notice>
          ) : null}
          {outcome ? <Notice kind={outcome.kind}>{outcome.text}</Notice> : null}
        </div>
      ) : null}
    </form>
  );
}
