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

const extensionOf = (name: string) => /\.([a-z0-9]+)$/i.exec(name)?.[1]?.toLowerCase() ?? "";

/**
 * The accepted type of a file: its extension must be one of ours, and a type the browser reports
 * must agree with it (a "photo" named report.html or setup.exe is refused whatever it claims).
 */
export function attachmentTypeOf(file: { name: string; type: string }): AttachmentContentType | null {
  const byExtension = Object.hasOwn(EXTENSION_TYPES, extensionOf(file.name)) ? EXTENSION_TYPES[extensionOf(file.name)] : undefined;
  if (!byExtension) return null;
  const reported = file.type.toLowerCase();
  if (reported === "") return byExtension;
  return Object.hasOwn(ATTACHMENT_TYPES, reported) && reported === byExtension ? byExtension : null;
}

/** The name a download is saved under: the original one, with the stored type's extension added when it lacks it. */
export function downloadNameFor(originalName: string, contentType: string): string {
  const ext = extensionOf(originalName);
  const fits = Object.hasOwn(EXTENSION_TYPES, ext) && EXTENSION_TYPES[ext] === contentType;
  if (fits) return originalName;
  const canonical = Object.entries(EXTENSION_TYPES).find(([, type]) => type === contentType)?.[0] ?? "bin";
  return `${originalName}.${canonical}`;
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

const INLINE_IMAGE_TYPES: readonly string[] = ["image/png", "image/jpeg", "image/webp"];
/** Only these are ever shown in the page (thumbnails); everything else downloads. */
export const isImageType = (contentType: string) => INLINE_IMAGE_TYPES.includes(contentType);
