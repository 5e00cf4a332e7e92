// One shape for every mail the service sends: a plain-text part and an HTML part made from the same
// paragraphs, with one link (never an attachment). Pure: no I/O, so templates are unit-tested as text.

export type ComposedMail = { subject: string; text: string; html: string };

export type MailBody = {
  subject: string;
  greeting: string;
  paragraphs: string[];
  link?: { label: string; url: string };
  /** Why the reader gets this mail and how to stop it (preferences), or who to ask. */
  footer: string;
};

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c] as string);
}

export function composeMail(body: MailBody): ComposedMail {
  const textParts = [body.greeting, ...body.paragraphs];
  if (body.link) textParts.push(`${body.link.label}:\n${body.link.url}`);
  textParts.push(`--\n${body.footer}`);
  const p = (t: string) => `<p style="margin:0 0 12px">${escapeHtml(t).replace(/\n/g, "<br>")}</p>`;
  const html = [
    `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1f2733;max-width:36rem">`,
    p(body.greeting),
    ...body.paragraphs.map(p),
    body.link ? `<p style="margin:16px 0"><a href="${escapeHtml(body.link.url)}" style="color:#a34a1c;font-weight:600">${escapeHtml(body.link.label)}</a></p>` : "",
    `<hr style="border:none;border-top:1px solid #d5dae1"><p style="font-size:12px;color:#5b6573">${escapeHtml(body.footer)}</p>`,
    `</body></html>`,
  ].join("");
  return { subject: body.subject, text: `${textParts.join("\n\n")}\n`, html };
}
