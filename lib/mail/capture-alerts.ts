import { composeMail, type ComposedMail } from "./compose";

// Quality engineers: a capture ended outside tolerance or inconclusive. One mail per unit per hour,
// or one digest a day, as each engineer chooses.

export type CaptureAlertFacts = {
  readerName: string; labName: string; serial: string; modelCode: string; fileName: string;
  overall: "fail" | "inconclusive"; link: string;
};

const WORDS = { fail: "outside tolerance", inconclusive: "inconclusive" } as const;

export function captureAlertMail(f: CaptureAlertFacts): ComposedMail {
  return composeMail({
    subject: `Unit ${f.serial}: a capture ended ${WORDS[f.overall]}`,
    greeting: `Hello ${f.readerName},`,
    paragraphs: [
      `The capture ${f.fileName} of unit ${f.serial} (model ${f.modelCode}) ended ${WORDS[f.overall]}.`,
      "Further results of this unit within the hour are not mailed again; the unit's page shows them all. Verdicts are advisory: review the figures before a decision.",
    ],
    link: { label: "Open the capture", url: f.link },
    footer: `Sent by ${f.labName} through Emfolio. Choose an hourly alert, a daily digest or no alerts on your account page.`,
  });
}

export type DigestLine = { serial: string; fileName: string; overall: "fail" | "inconclusive" };

export function captureDigestMail(f: { readerName: string; labName: string; day: string; lines: DigestLine[]; link: string }): ComposedMail {
  const list = f.lines.map((l) => `• ${l.serial}: ${l.fileName}, ${WORDS[l.overall]}`).join("\n");
  return composeMail({
    subject: `Captures outside tolerance or inconclusive on ${f.day}: ${f.lines.length}`,
    greeting: `Hello ${f.readerName},`,
    paragraphs: [`On ${f.day} (UTC) ${f.lines.length === 1 ? "one capture" : `${f.lines.length} captures`} ended outside tolerance or inconclusive:`, list],
    link: { label: "Open the review queue", url: f.link },
    footer: `Sent by ${f.labName} through Emfolio. Choose an hourly alert, a daily digest or no alerts on your account page.`,
  });
}
