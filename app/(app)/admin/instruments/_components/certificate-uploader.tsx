"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { useUploadThing } from "@/components/attachments/uploadthing";
import { Button } from "@/components/ui/button";
import { Field, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";

/** Files one calibration certificate (PDF) for an instrument through the attachment upload path. */
export function CertificateUploader({ instrumentId }: { instrumentId: string }) {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const [outcome, setOutcome] = useState<{ kind: "done" | "problem"; text: string } | null>(null);
  const { startUpload, isUploading } = useUploadThing("instrumentCertificate", {
    onClientUploadComplete: () => {
      setOutcome({ kind: "done", text: "Certificate filed." });
      setFile(null);
      router.refresh();
    },
    onUploadError: (err) => setOutcome({ kind: "problem", text: `Nothing was filed: ${err.message}` }),
  });
  const onSubmit = async (e: FormEvent) => {
    e.preventDefault();
    if (!file) return;
    if (file.type !== "application/pdf") {
      setOutcome({ kind: "problem", text: `${file.name} is not a PDF: certificates are filed as PDF.` });
      return;
    }
    setOutcome(null);
    await startUpload([file], { instrumentId });
  };
  return (
    <form onSubmit={onSubmit} className="flex flex-wrap items-end gap-3" aria-label="File a certificate">
      {outcome ? <div className="w-full"><Notice kind={outcome.kind}>{outcome.text}</Notice></div> : null}
      <Field label="Certificate (PDF)"><TextInput type="file" accept="application/pdf" onChange={(e) => setFile(e.target.files?.[0] ?? null)} /></Field>
      <Button type="submit" disabled={!file || isUploading}>{isUploading ? "Uploading…" : "File certificate"}</Button>
    </form>
  );
}
