import nodemailer from "nodemailer";
import { describe, expect, it } from "vitest";
import { compose, escapeHtml, oneLine } from "@/lib/mail/compose";
import * as templates from "@/lib/mail/templates";

const HOSTILE = `<script>alert("x")</script> & 'quotes'`;

describe("composing a message", () => {
  it("escapes the five HTML-significant characters", () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe("&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;");
  });

  it("puts the same words in the text and the HTML part, escaped only in the HTML", () => {
    const mail = compose("Subject", ["Plain paragraph.", { quote: HOSTILE, label: "Said:" }, { facts: [["Name", HOSTILE], ["Affiliation", null]] }, { link: "https://fitledger.test/signin?a=1&b=2", label: "Sign in" }]);
    expect(mail.text).toContain(`  > ${HOSTILE}`);
    expect(mail.text).toContain("Affiliation: —");
    expect(mail.text).toContain("Sign in:\nhttps://fitledger.test/signin?a=1&b=2");
    expect(mail.html).not.toContain("<script>");
    expect(mail.html.match(/&lt;script&gt;alert\(&quot;x&quot;\)&lt;\/script&gt; &amp; &#39;quotes&#39;/g)).toHaveLength(2);
    expect(mail.html).toContain('href="https://fitledger.test/signin?a=1&amp;b=2"');
  });

  it("flattens subjects to one bounded line, so no header can be injected", () => {
    expect(oneLine("Hello\r\nBcc: someone@example.org")).toBe("Hello Bcc: someone@example.org");
    expect(compose("x".repeat(400), []).subject.length).toBe(250);
  });
});

describe("the templates", () => {
  it("application received: names the applicant and links to the pending list", () => {
    const mail = templates.applicationReceived({ name: HOSTILE, email: "a@example.org", affiliation: null, reason: "Because.", reviewUrl: "https://fitledger.test/admin/people?status=pending" });
    expect(mail.subject).toContain("New account application");
    expect(mail.text).toContain("https://fitledger.test/admin/people?status=pending");
    expect(mail.html).not.toContain("<script>");
  });

  it("approved names the role; declined and suspended quote the admin's reason", () => {
    expect(templates.accountApproved({ name: "Ana", role: "curator", signInUrl: "https://fitledger.test/signin" }).text).toMatch(/as a curator, which lets you code papers and verify/);
    expect(templates.accountDeclined({ name: "Ana", reason: "Not an audit project." }).text).toContain("> Not an audit project.");
    expect(templates.accountSuspended({ name: "Ana", reason: "Copied entries." }).text).toContain("> Copied entries.");
  });

  it("password reset: the link, how long it works, and what to do if it was not you", () => {
    const mail = templates.passwordReset({ name: "Ana", resetUrl: "https://fitledger.test/reset/new?token=abc", expiresInMinutes: 60 });
    expect(mail.text).toContain("https://fitledger.test/reset/new?token=abc");
    expect(mail.text).toContain("works once, for the next 60 minutes");
    expect(mail.text).toMatch(/did not ask for this, ignore/);
  });

  it("entry returned: the paper, the curator's comment and a link to the workbench", () => {
    const mail = templates.entryReturned({ name: "Ana", paperTitle: "Measurement invariance of the <i>Big Five</i>", comment: "Δdf for M2 vs M1 is 3 in Table 2, not 2.", entryUrl: "https://fitledger.test/workbench" });
    expect(mail.subject).toBe("Your entry was returned: Measurement invariance of the <i>Big Five</i>");
    expect(mail.text).toContain("> Δdf for M2 vs M1 is 3 in Table 2, not 2.");
    expect(mail.html).toContain("Measurement invariance of the &lt;i&gt;Big Five&lt;/i&gt;");
  });

  it("a password change says that the other sessions were signed out", () => {
    const content = templates.passwordChanged({ name: "Ana", resetUrl: "https://fitledger.test/reset" });
    expect(content.text).toContain("wherever else you were signed in has been signed out");
  });

  it("every template goes through nodemailer as a two-part message", async () => {
    const transport = nodemailer.createTransport({ jsonTransport: true });
    const samples = [
      templates.applicationAcknowledged({ name: "Ana" }),
      templates.addressAlreadyRegistered({ signInUrl: "https://fitledger.test/signin", resetUrl: "https://fitledger.test/reset" }),
      templates.accountReactivated({ name: "Ana", signInUrl: "https://fitledger.test/signin" }),
      templates.roleChanged({ name: "Ana", previousRole: "contributor", role: "curator" }),
      templates.passwordChanged({ name: "Ana", resetUrl: "https://fitledger.test/reset" }),
    ];
    for (const content of samples) {
      const info = await transport.sendMail({ from: "Fitledger <no-reply@fitledger.test>", to: "ana@example.org", ...content });
      const sent = JSON.parse(String(info.message)) as { subject: string; text: string; html: string };
      expect(sent.subject).toBe(content.subject);
      expect(sent.text).toContain("Fitledger");
      expect(sent.html).toMatch(/^<!doctype html>/);
    }
  });
});
