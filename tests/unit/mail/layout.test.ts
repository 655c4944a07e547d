import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { MAIL_COLORS, productMail } from "../../../server/mail/layout";
import { clipFailedMail, clipReadyMail } from "../../../server/mail/clip-templates";
import { shotSharedMail } from "../../../server/mail/readout-templates";
import { inviteMail, paymentFailedMail, resetPasswordMail, signupMail } from "../../../server/mail/templates";

// Every message comes out of one layout in the product's look; its colours are the app's own.
const theme = readFileSync("src/styles.css", "utf8");
const token = (name: string) => theme.match(new RegExp(`--color-${name}:\\s*(#[0-9a-f]{6})`, "i"))?.[1]?.toLowerCase();

describe("mail in the product's look", () => {
  it("uses the app's palette (src/styles.css @theme)", () => {
    const pairs: [keyof typeof MAIL_COLORS, string][] = [["paper", "paper"], ["surface", "surface"], ["line", "line"], ["ink", "ink"], ["inkMuted", "ink-muted"], ["accent", "accent"], ["accentInk", "accent-ink"], ["gold", "gold"]];
    for (const [k, css] of pairs) expect(MAIL_COLORS[k], css).toBe(token(css));
  });

  const all = [
    inviteMail({ to: "a@x.example", teamName: "Lakeport U18", inviterName: "Dana Okafor", role: "coach", url: "http://127.0.0.1:3000/invite/abc" }),
    resetPasswordMail({ to: "a@x.example", url: "http://127.0.0.1:3000/reset?t=1" }),
    signupMail({ to: "a@x.example", url: "http://127.0.0.1:3000/signup/confirm?t=1" }),
    paymentFailedMail({ to: "a@x.example", name: "Dana", clubName: "Lakeport Ravens", graceEndsAt: new Date("2026-12-20T00:00:00Z"), url: "http://127.0.0.1:3000/billing" }),
    clipReadyMail({ to: "a@x.example", name: "Dana", clipTitle: "Lane 1", frameCount: 2400, captureFps: 3200, confirmRate: false, url: "http://127.0.0.1:3000/clips/1" }),
    clipFailedMail({ to: "a@x.example", name: "Dana", clipTitle: "Lane 1", reason: "no video stream", url: "http://127.0.0.1:3000/clips/1" }),
    shotSharedMail({ to: "a@x.example", name: "Theo", sharerName: "Dana", teamName: "Lakeport U18", shotTitle: "Point shot", headline: "Puck exit speed 108.4 ± 1.3 km/h", ownShot: true, url: "http://127.0.0.1:3000/readout/1", settingsUrl: "http://127.0.0.1:3000/settings" }),
  ];

  it("every message: the wordmark, one accent button with the link, the address to paste, and the same text part", () => {
    for (const m of all) {
      expect(m.html).toContain(">Loadframe</span>");
      expect(m.html).toContain(`background:${MAIL_COLORS.accent};border-radius:8px`);
      expect(m.html).toContain("IBM Plex Sans");
      const link = m.text.match(/: (http:\/\/\S+)\n/)?.[1];
      expect(link, m.subject).toBeTruthy();
      expect(m.html).toContain(`href="${link!.replace(/&/g, "&#38;")}"`);
      expect(m.text.trim().endsWith("— Loadframe")).toBe(true);
    }
  });

  it("escapes what people typed, in the body and in the title", () => {
    const m = productMail({ to: "a@x.example", subject: "<b>Shot</b>", lines: ['Theo "the cannon" <script>alert(1)</script>'], action: { url: "http://h/x?a=1&b=2", label: "Open" } });
    expect(m.html).not.toContain("<script>");
    expect(m.html).toContain("&#60;script&#62;");
    expect(m.html).toContain("<title>&#60;b&#62;Shot&#60;/b&#62;</title>");
    expect(m.html).toContain('href="http://h/x?a=1&#38;b=2"');
  });

  it("the footer says why the person gets it, with the way to stop it as a link", () => {
    const shared = all[6];
    expect(shared.html).toMatch(/You get this because a coach shared a shot with you\. <a href="http:\/\/127\.0\.0\.1:3000\/settings"[^>]*>Turn these messages off<\/a>/);
    expect(shared.text).toContain("Turn these messages off: http://127.0.0.1:3000/settings");
  });
});
