import { describe, expect, it } from "vitest";
import { invitationMail } from "@/lib/mail/account-links";
import { fromHeader } from "@/lib/server/mail";

describe("invitationMail(facts)", () => {
  it("names who invited whom, to which organisation, with which role, in both parts, with the link escaped in HTML", () => {
    const m = invitationMail({ inviteeName: "Ruan <R>", inviterName: "Maren Ilsley", organisationName: "Kestrum", roleLabel: "Client", labName: "Harrowgate", link: "http://x/set-password?token=a&b" });
    for (const part of [m.text, m.html]) expect(part).toMatch(/Maren Ilsley of Harrowgate has given you an Emfolio account for Kestrum, with the role (&quot;|")Client/);
    expect(m.html).toContain("Ruan &lt;R&gt;");
    expect(m.html).toContain('href="http://x/set-password?token=a&amp;b"');
    expect(m.text).toContain("http://x/set-password?token=a&b");
  });
});

describe("fromHeader(name, MAIL_FROM)", () => {
  it("keeps the configured address under the lab's display name", () => {
    expect(fromHeader("Harrowgate Test Lab", "Emfolio <no-reply@emfolio.invalid>")).toEqual({ name: "Harrowgate Test Lab", address: "no-reply@emfolio.invalid" });
    expect(fromHeader(undefined, "a@b.c")).toBe("a@b.c");
  });
});
