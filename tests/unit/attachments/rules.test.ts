import { describe, expect, it } from "vitest";
import { attachmentKind } from "@/db/schema";
import {
  ATTACHMENT_KINDS, ATTACHMENT_MAX_BYTES, attachmentTypeOf, attachmentUploadInputSchema, checkAttachmentFiles, downloadNameFor, formatBytes, isImageType,
} from "@/lib/attachments/rules";
import { uploadthingTokenSchema } from "@/lib/server/env";

const png = { name: "plate.png", type: "image/png", size: 20_000 };

describe("attachment rules", () => {
  it("checkAttachmentFiles accepts PNG, JPEG, WebP and PDF up to 16 MiB, ten at a time", () => {
    const files = [png, { name: "a.jpg", type: "image/jpeg", size: 1 }, { name: "b.webp", type: "image/webp", size: 1 }, { name: "c.pdf", type: "application/pdf", size: ATTACHMENT_MAX_BYTES }];
    expect(checkAttachmentFiles(files)).toEqual([]);
    expect(checkAttachmentFiles(Array.from({ length: 10 }, () => png))).toEqual([]);
  });

  it("checkAttachmentFiles names each refused file with the rule it broke", () => {
    expect(checkAttachmentFiles([{ name: "wiring.svg", type: "image/svg+xml", size: 10 }])).toEqual(["“wiring.svg” is not a PNG, JPEG, WebP or PDF file: only those can be attached."]);
    expect(checkAttachmentFiles([{ ...png, name: "big.png", size: ATTACHMENT_MAX_BYTES + 1 }])).toEqual(["“big.png” is just over 16 MB; the limit is 16 MB per file."]);
    expect(checkAttachmentFiles([{ ...png, name: "huge.pdf", type: "application/pdf", size: 40 * 1024 * 1024 }])[0]).toMatch(/“huge\.pdf” is 40 MB; the limit is 16 MB per file\./);
    expect(checkAttachmentFiles([{ ...png, size: 0 }])).toEqual(["“plate.png” is empty."]);
    expect(checkAttachmentFiles(Array.from({ length: 11 }, () => png))).toEqual(["Attach at most 10 files at once (you picked 11)."]);
    expect(checkAttachmentFiles([])).toEqual(["Pick at least one file."]);
  });

  it("attachmentTypeOf needs one of our extensions, and a reported type that agrees with it", () => {
    expect(attachmentTypeOf({ name: "x.PNG", type: "" })).toBe("image/png");
    expect(attachmentTypeOf({ name: "x.jpeg", type: "" })).toBe("image/jpeg");
    expect(attachmentTypeOf({ name: "x.jpg", type: "image/jpeg" })).toBe("image/jpeg");
    expect(attachmentTypeOf({ name: "x.png", type: "text/html" })).toBeNull();
    expect(attachmentTypeOf({ name: "x.exe", type: "" })).toBeNull();
    // A file that claims an accepted type under a name that would run or render when opened.
    expect(attachmentTypeOf({ name: "report.html", type: "image/png" })).toBeNull();
    expect(attachmentTypeOf({ name: "wiring.svg", type: "image/png" })).toBeNull();
    expect(attachmentTypeOf({ name: "setup.exe", type: "application/pdf" })).toBeNull();
    expect(attachmentTypeOf({ name: "plate.png", type: "application/pdf" })).toBeNull();
    expect(attachmentTypeOf({ name: "plate", type: "image/png" })).toBeNull();
    expect(attachmentTypeOf({ name: "x.constructor", type: "constructor" })).toBeNull();
  });

  it("downloadNameFor keeps a fitting name and adds the stored type's extension otherwise", () => {
    expect(downloadNameFor("plate.png", "image/png")).toBe("plate.png");
    expect(downloadNameFor("scope.JPG", "image/jpeg")).toBe("scope.JPG");
    expect(downloadNameFor("report.html", "image/png")).toBe("report.html.png");
    expect(downloadNameFor("cert", "application/pdf")).toBe("cert.pdf");
  });

  it("isImageType shows only PNG, JPEG and WebP in the page", () => {
    expect(["image/png", "image/jpeg", "image/webp"].every(isImageType)).toBe(true);
    expect(isImageType("image/svg+xml")).toBe(false);
    expect(isImageType("application/pdf")).toBe(false);
  });

  it("formatBytes uses binary multiples (common practice for file sizes)", () => {
    expect(formatBytes(512)).toBe("512 B");
    expect(formatBytes(1536)).toBe("1.5 KB");
    expect(formatBytes(16 * 1024 * 1024)).toBe("16 MB");
  });

  it("attachmentUploadInputSchema takes a uuid, a known kind and a short caption", () => {
    const unitId = "00000000-0000-4000-8000-000000000000";
    expect(attachmentUploadInputSchema.parse({ unitId, kind: "nameplate" })).toEqual({ unitId, kind: "nameplate", caption: "" });
    expect(attachmentUploadInputSchema.safeParse({ unitId, kind: "selfie" }).success).toBe(false);
    expect(attachmentUploadInputSchema.safeParse({ unitId: "7", kind: "other" }).success).toBe(false);
    expect(attachmentUploadInputSchema.safeParse({ unitId, kind: "other", caption: "x".repeat(201) }).success).toBe(false);
  });

  it("the kinds of the form are the database enum's values", () => {
    expect([...ATTACHMENT_KINDS]).toEqual(attachmentKind.enumValues);
  });
});

describe("uploadthingTokenSchema", () => {
  const token = (o: unknown) => Buffer.from(JSON.stringify(o)).toString("base64");
  it("accepts base64 JSON with an sk_ key, an app id and regions", () => {
    expect(uploadthingTokenSchema.safeParse(token({ apiKey: "sk_live_x", appId: "a", regions: ["local"] })).success).toBe(true);
  });
  it("refuses another key prefix, no regions, and text that is not base64 JSON", () => {
    expect(uploadthingTokenSchema.safeParse(token({ apiKey: "pk_x", appId: "a", regions: ["r"] })).success).toBe(false);
    expect(uploadthingTokenSchema.safeParse(token({ apiKey: "sk_x", appId: "a", regions: [] })).success).toBe(false);
    expect(uploadthingTokenSchema.safeParse("sk_live_plain").success).toBe(false);
  });
});
