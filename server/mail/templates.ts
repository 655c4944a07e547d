import type { Mail } from "./mailer";
import { productMail } from "./layout";

// Plain, short messages: one sentence of context and the link, in text and in HTML (the product's look: layout.ts).
function layout(to: string, subject: string, lines: string[], action: { url: string; label: string }): Mail {
  return productMail({ to, subject, lines, action });
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

export function resetPasswordMail(p: { to: string; url: string }): Mail {
  return layout(
    p.to,
    "Reset your Loadframe password",
    ["Hello,", "Someone asked to reset the password of this account. If it was not you, ignore this message.", "The link is valid for one hour."],
    { url: p.url, label: "Choose a new password" },
  );
}

export function paymentFailedMail(p: { to: string; name: string; clubName: string; graceEndsAt: Date; url: string }): Mail {
  const until = p.graceEndsAt.toLocaleDateString("en-US", { dateStyle: "long", timeZone: "UTC" });
  return layout(
    p.to,
    `Payment for ${p.clubName} on Loadframe failed`,
    [`Hello ${p.name},`, `The renewal payment for ${p.clubName} did not go through.`,
      `Everything keeps working until ${until}. After that the club's teams become read-only until the invoice is paid: nothing is deleted, and paying restores them at once.`],
    { url: p.url, label: "Pay the open invoice" },
  );
}

export function readOnlyMail(p: { to: string; name: string; clubName: string; url: string }): Mail {
  return layout(
    p.to,
    `${p.clubName} on Loadframe is read-only until paid`,
    [`Hello ${p.name},`, `The open invoice of ${p.clubName} is still unpaid, so its teams are now read-only: everyone can still see everything, but nothing can be added or changed.`,
      "Nothing has been deleted. Paying the invoice restores the teams at once."],
    { url: p.url, label: "Pay the open invoice" },
  );
}

export function signupMail(p: { to: string; url: string }): Mail {
  return layout(
    p.to,
    "Confirm your e-mail to start your club on Loadframe",
    ["Someone (we hope you) asked to start a club on Loadframe with this address. If it was not you, ignore this message.", "The link is valid for 24 hours."],
    { url: p.url, label: "Confirm and continue" },
  );
}

export function signupExistingMail(p: { to: string; url: string }): Mail {
  return layout(
    p.to,
    "You already have a Loadframe account",
    ["Someone (we hope you) asked to start a club on Loadframe with this address, which already has an account. Sign in instead; if you forgot the password, the sign-in page can send a new one."],
    { url: p.url, label: "Sign in" },
  );
}
