import nodemailer, { type Transporter } from "nodemailer";
import { env } from "../env";

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

let transport: Transporter | undefined;

/** Send through the configured SMTP server (the local dev inbox unless configured otherwise). */
export async function sendMail(mail: Mail): Promise<void> {
  const e = env();
  transport ??= nodemailer.createTransport({ host: e.SMTP_HOST, port: e.SMTP_PORT, secure: false, ignoreTLS: true });
  await transport.sendMail({ from: e.MAIL_FROM, ...mail });
}
