// Tell the uploader when their clip is ready or failed, unless they turned it off.
import { env } from "../env";
import { log } from "../log";
import { sendMail } from "../mail/mailer";
import { clipFailedMail, clipReadyMail } from "../mail/clip-templates";
import { getPrefs } from "../entities/user/prefs";
import { needsCaptureRateConfirmation } from "../../shared/schemas/clips";
import type { ClipRow } from "../entities/clip/repository";
import { userContact } from "../entities/user/account";

export async function notifyClipDone(c: ClipRow): Promise<void> {
  if (!c.uploadedBy) return;
  try {
    if (!(await getPrefs(c.uploadedBy)).notifyClipReady) return;
    const who = await userContact(c.uploadedBy);
    if (!who) return;
    const url = `${env().PUBLIC_URL}/clips/${c.id}`;
    const clipTitle = c.title || c.originalName || "Your clip";
    const mail =
      c.status === "ready"
        ? clipReadyMail({ to: who.email, name: who.name, clipTitle, frameCount: c.frameCount ?? 0, captureFps: c.captureFps, confirmRate: needsCaptureRateConfirmation(c), url })
        : clipFailedMail({ to: who.email, name: who.name, clipTitle, reason: c.failureReason ?? "unknown", url });
    await sendMail(mail);
  } catch (err) {
    // A mail server being down must not fail the clip.
    log.warn({ err, clipId: c.id }, "could not send the clip notification");
  }
}
