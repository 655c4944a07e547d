import type { Mail } from "./mailer";

// The message a person gets when a coach shares a shot with them: who, which shot, its headline
// number in the recipient's own units, and the link to the readout.
const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

export interface ShotSharedMail {
  to: string;
  name: string;
  sharerName: string;
  teamName: string;
  shotTitle: string;
  /** e.g. "Puck exit speed 108.4 ± 1.3 km/h", already in the recipient's units; null without results. */
  headline: string | null;
  /** True when the recipient is the shot's player. */
  ownShot: boolean;
  url: string;
  settingsUrl: string;
}

export function shotSharedMail(p: ShotSharedMail): Mail {
  const lines = [
    `Hello ${p.name},`,
    p.ownShot
      ? `${p.sharerName} shared your shot "${p.shotTitle}" with you in ${p.teamName}.`
      : `${p.sharerName} shared the shot "${p.shotTitle}" with you in ${p.teamName}.`,
  ];
  if (p.headline) lines.push(`${p.headline}.`);
  lines.push("The readout has every result with its uncertainty, the phase timeline and the charts; you can download it as a PDF.");
  const footer = `You get this because a coach shared a shot with you. Turn these messages off in your notification settings: ${p.settingsUrl}`;
  return {
    to: p.to,
    subject: `${p.sharerName} shared a shot with you: ${p.shotTitle}`,
    text: [...lines, "", `Open the readout: ${p.url}`, "", footer, "— Loadframe"].join("\n"),
    html:
      `<div style="font-family:sans-serif;max-width:520px">${lines.map((l) => `<p>${esc(l)}</p>`).join("")}` +
      `<p><a href="${esc(p.url)}" style="background:#0b6e69;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">Open the readout</a></p>` +
      `<p style="color:#666;font-size:12px">Or paste this address into your browser: ${esc(p.url)}</p>` +
      `<p style="color:#666;font-size:12px">You get this because a coach shared a shot with you. <a href="${esc(p.settingsUrl)}">Turn these messages off</a>.</p></div>`,
  };
}
