import type { Mail } from "./mailer";

// Plain, short messages: one sentence of context and the link, in text and in HTML.
const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function layout(to: string, subject: string, lines: string[], link: { url: string; label: string }): Mail {
  const text = [...lines, "", `${link.label}: ${link.url}`, "", "— Loadframe"].join("\n");
  const html =
    `<div style="font-family:sans-serif;max-width:520px">` +
    lines.map((l) => `<p>${esc(l)}</p>`).join("") +
    `<p><a href="${esc(link.url)}" style="background:#1f5f8b;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${esc(link.label)}</a></p>` +
    `<p style="color:#666;font-size:12px">Or paste this address into your browser: ${esc(link.url)}</p></div>`;
  return { to, subject, text, html };
}

export const roleLabel: Record<string, string> = { admin: "team admin", coach: "coach", analyst: "analyst", player: "player" };

export function inviteMail(p: { to: string; teamName: string; inviterName: string; role: string; url: string }): Mail {
  return layout(
    p.to,
    `You're invited to ${p.teamName} on Loadframe`,
    [`${p.inviterName} invited you to join ${p.teamName} as ${roleLabel[p.role] ?? p.role}.`, "The link is valid for 7 days."],
    { url: p.url, label: "Join the team" },
  );
}

export function resetPasswordMail(p: { to: string; name: string; url: string }): Mail {
  return layout(
    p.to,
    "Reset your Loadframe password",
    [`Hello ${p.name},`, "Someone asked to reset the password of this account. If it was not you, ignore this message.", "The link is valid for one hour."],
    { url: p.url, label: "Choose a new password" },
  );
}
