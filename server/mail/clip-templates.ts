import type { Mail } from "./mailer";
import { productMail } from "./layout";

// Messages about a clip the person uploaded: ready for digitising, or failed with the reason.
function clipMail(to: string, subject: string, lines: string[], url: string, label: string): Mail {
  const footer = { text: "You get this because you uploaded the clip. Turn these messages off under your account's notification settings." };
  return productMail({ to, subject, lines, action: { url, label }, footer });
}

export function clipReadyMail(p: { to: string; name: string; clipTitle: string; frameCount: number; captureFps: number; confirmRate: boolean; url: string }): Mail {
  const lines = [`Hello ${p.name},`, `"${p.clipTitle}" is ready: ${p.frameCount.toLocaleString("en")} frames, captured at ${p.captureFps.toLocaleString("en")} fps.`];
  if (p.confirmRate) lines.push("The file's stored rate looks like a playback rate. Confirm the capture rate on the clip before reading any speeds.");
  return clipMail(p.to, `Clip ready: ${p.clipTitle}`, lines, p.url, "Open the clip");
}

export function clipFailedMail(p: { to: string; name: string; clipTitle: string; reason: string; url: string }): Mail {
  return clipMail(
    p.to,
    `Clip could not be processed: ${p.clipTitle}`,
    [`Hello ${p.name},`, `The frames of "${p.clipTitle}" could not be extracted.`, `Reason: ${p.reason}`, "You can retry from the clip's page once the cause is fixed."],
    p.url,
    "Open the clip",
  );
}
