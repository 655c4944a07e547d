import type { Mail } from "./mailer";

// Every message in the product's own look: the paper ground, a white card, the wordmark in the
// accent colour, the accent button, muted small print. Mail clients ignore style sheets and most
// SVG, so this is a table with inline styles; the colours are the app's (src/styles.css @theme,
// held equal by tests/unit/mail/layout.test.ts) and the font is the app's with safe fallbacks.
export const MAIL_COLORS = {
  paper: "#f5f6f3",
  surface: "#ffffff",
  line: "#d9ddd6",
  ink: "#1b2224",
  inkMuted: "#556064",
  accent: "#0b6e69",
  accentInk: "#ffffff",
  gold: "#f3c969",
} as const;

const FONT = "'IBM Plex Sans', 'Segoe UI', Helvetica, Arial, sans-serif";
const c = MAIL_COLORS;

export const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (ch) => `&#${ch.charCodeAt(0)};`);

export interface MailParts {
  to: string;
  subject: string;
  /** Paragraphs of plain text (escaped here). */
  lines: string[];
  action: { url: string; label: string };
  /** Why the person gets this, and how to stop it; `link` becomes a link in the HTML part. */
  footer?: { text: string; link?: { url: string; label: string } };
}

export function productMail(p: MailParts): Mail {
  const footerText = p.footer ? (p.footer.link ? `${p.footer.text} ${p.footer.link.label}: ${p.footer.link.url}` : p.footer.text) : null;
  const text = [...p.lines, "", `${p.action.label}: ${p.action.url}`, "", ...(footerText ? [footerText, ""] : []), "— Loadframe"].join("\n");
  const para = (s: string) => `<p style="margin:0 0 14px;font-size:15px;line-height:1.55;color:${c.ink}">${escapeHtml(s)}</p>`;
  const small = `margin:0 0 8px;font-size:12px;line-height:1.5;color:${c.inkMuted}`;
  const footerHtml = p.footer
    ? `<p style="${small}">${escapeHtml(p.footer.text)}${p.footer.link ? ` <a href="${escapeHtml(p.footer.link.url)}" style="color:${c.accent}">${escapeHtml(p.footer.link.label)}</a>.` : ""}</p>`
    : "";
  const html =
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>${escapeHtml(p.subject)}</title></head>` +
    `<body style="margin:0;padding:0;background:${c.paper};font-family:${FONT}">` +
    `<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background:${c.paper}"><tr><td align="center" style="padding:28px 12px">` +
    `<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="max-width:560px">` +
    `<tr><td style="padding:0 4px 14px;font-family:${FONT}">` +
    `<span style="display:inline-block;width:22px;height:22px;border-radius:6px;background:${c.accent};vertical-align:middle;border-bottom:3px solid ${c.gold};box-sizing:border-box"></span>` +
    `<span style="font-size:18px;font-weight:600;color:${c.ink};vertical-align:middle;margin-left:8px;letter-spacing:-0.01em">Loadframe</span></td></tr>` +
    `<tr><td style="background:${c.surface};border:1px solid ${c.line};border-radius:12px;padding:26px 26px 18px;font-family:${FONT}">` +
    p.lines.map(para).join("") +
    `<table role="presentation" cellpadding="0" cellspacing="0" style="margin:6px 0 18px"><tr><td style="background:${c.accent};border-radius:8px">` +
    `<a href="${escapeHtml(p.action.url)}" style="display:inline-block;padding:11px 18px;font-size:15px;font-weight:600;color:${c.accentInk};text-decoration:none;font-family:${FONT}">${escapeHtml(p.action.label)}</a>` +
    `</td></tr></table>` +
    `<p style="${small}">Or paste this address into your browser: <span style="word-break:break-all">${escapeHtml(p.action.url)}</span></p>` +
    `</td></tr>` +
    `<tr><td style="padding:14px 6px 0;font-family:${FONT}">${footerHtml}<p style="${small}">Loadframe — shot analysis for hockey teams.</p></td></tr>` +
    `</table></td></tr></table></body></html>`;
  return { to: p.to, subject: p.subject, text, html };
}
