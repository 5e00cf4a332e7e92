import { z } from "zod";

// What may be attached to a unit. Pure: used by the upload form, the upload route's middleware
// and the tests. SVG and other scriptable types are left out on purpose.

export const ATTACHMENT_TYPES = {
  "image/png": "PNG",
  "image/jpeg": "JPEG",
  "image/webp": "WebP",
  "application/pdf": "PDF",
} as const;

export type AttachmentContentType = keyof typeof ATTACHMENT_TYPES;

export const ATTACHMENT_MAX_BYTES = 16 * 1024 * 1024;
/** The same limit in the notation uploadthing's route config takes. */
export const ATTACHMENT_MAX_SIZE = "16MB";
export const ATTACHMENT_MAX_FILES = 10;

export const ATTACHMENT_KINDS = ["nameplate", "set-up", "scope-screen", "certificate", "other"] as const;

export const ATTACHMENT_KIND_LABELS: Record<(typeof ATTACHMENT_KINDS)[number], string> = {
  nameplate: "Nameplate photo",
  "set-up": "Bench set-up",
  "scope-screen": "Scope screen",
  certificate: "Calibration certificate",
  other: "Other (signed sheet, note)",
};

export const attachmentUploadInputSchema = z.object({
  unitId: z.uuid(),
  kind: z.enum(ATTACHMENT_KINDS),
  caption: z.string().trim().max(200).default(""),
});

export type AttachmentUploadInput = z.input<typeof attachmentUploadInputSchema>;

export const deleteAttachmentSchema = z.object({ attachmentId: z.uuid(), unitId: z.uuid() });

const EXTENSION_TYPES: Record<string, AttachmentContentType> = {
  png: "image/png", jpg: "image/jpeg", jpeg: "image/jpeg", webp: "image/webp", pdf: "application/pdf",
};

/** The accepted type of a file: its browser-reported type, or its extension when the browser gave none. */
export function attachmentTypeOf(file: { name: string; type: string }): AttachmentContentType | null {
  const type = file.type.toLowerCase();
  if (type in ATTACHMENT_TYPES) return type as AttachmentContentType;
  if (type !== "") return null;
  const ext = /\.([a-z0-9]+)$/i.exec(file.name)?.[1]?.toLowerCase() ?? "";
  return EXTENSION_TYPES[ext] ?? null;
}

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  const [value, unit] = bytes < 1024 * 1024 ? [bytes / 1024, "KB"] : [bytes / 1024 / 1024, "MB"];
  return `${value.toFixed(1).replace(/\.0$/, "")} ${unit}`;
}

const names = Object.values(ATTACHMENT_TYPES);
const typeList = `${names.slice(0, -1).join(", ")} or ${names.at(-1)}`;

/** One message per problem, each naming the file and the limit; empty when all may be uploaded. */
export function checkAttachmentFiles(files: readonly { name: string; type: string; size: number }[]): string[] {
  const problems: string[] = [];
  if (files.length === 0) problems.push("Pick at least one file.");
  if (files.length > ATTACHMENT_MAX_FILES) {
    problems.push(`Attach at most ${ATTACHMENT_MAX_FILES} files at once (you picked ${files.length}).`);
  }
  for (const f of files) {
    if (!attachmentTypeOf(f)) problems.push(`“${f.name}” is not a ${typeList} file: only those can be attached.`);
    else if (f.size > ATTACHMENT_MAX_BYTES) {
      const limit = formatBytes(ATTACHMENT_MAX_BYTES);
      const size = formatBytes(f.size) === limit ? `just over ${limit}` : formatBytes(f.size);
      problems.push(`“${f.name}” is ${size}; the limit is ${limit} per file.`);
    } else if (f.size === 0) problems.push(`“${f.name}” is empty.`);
  }
  return problems;
}

export const isImageType = (contentType: string) => contentType.startsWith("image/");
