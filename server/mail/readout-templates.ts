import type { Mail } from "./mailer";
import { productMail } from "./layout";

// The message a person gets when a coach shares a shot with them: who, which shot, its headline
// number in the recipient's own units, and the link to the readout.

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
  return productMail({
    to: p.to,
    subject: `${p.sharerName} shared a shot with you: ${p.shotTitle}`,
    lines,
    action: { url: p.url, label: "Open the readout" },
    footer: { text: "You get this because a coach shared a shot with you.", link: { url: p.settingsUrl, label: "Turn these messages off" } },
  });
}
