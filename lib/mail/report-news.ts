import { composeMail, type ComposedMail } from "./compose";

// A client's report was released, superseded or withdrawn. The mail links to the portal; the report
// itself is never attached (the portal serves the stored, checksummed bytes).

export type ReportEvent = "released" | "superseded" | "withdrawn";

export type ReportNewsFacts = {
  event: ReportEvent; readerName: string; labName: string; number: string; revision: number; serial: string; modelCode: string;
  reason: string | null; link: string;
};

const HEADLINE: Record<ReportEvent, (f: ReportNewsFacts) => string> = {
  released: (f) => `Test report ${f.number} revision ${f.revision} for unit ${f.serial} is released`,
  superseded: (f) => `Test report ${f.number} revision ${f.revision} for unit ${f.serial} is superseded`,
  withdrawn: (f) => `Test report ${f.number} revision ${f.revision} for unit ${f.serial} is withdrawn`,
};

const MEANING: Record<ReportEvent, string> = {
  released: "It is valid from today. Download the PDF or the CSV of its results from your portal.",
  superseded: "A newer revision replaces it: do not rely on this revision any more. The portal shows the current one.",
  withdrawn: "The lab withdrew it: it is no longer valid, and no revision replaces it for now.",
};

export function reportNewsMail(f: ReportNewsFacts): ComposedMail {
  const paragraphs = [`${HEADLINE[f.event](f)} (model ${f.modelCode}).`, MEANING[f.event]];
  if (f.reason) paragraphs.push(`Reason given by ${f.labName}: ${f.reason}`);
  return composeMail({
    subject: `${HEADLINE[f.event](f)}`,
    greeting: `Hello ${f.readerName},`,
    paragraphs,
    link: { label: "Open the report in your portal", url: f.link },
    footer: `Sent by ${f.labName} through Emfolio. Choose which mails you receive on your account page.`,
  });
}
